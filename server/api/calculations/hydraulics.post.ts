/**
 * POST /api/calculations/hydraulics
 * Body (SI units): { pedalForceN, pedalRatio, boosterRatio, masterCylinder: { boreMm, strokeMm? }, split,
 *   massKg?, axles: { front: AXLE, rear: AXLE }, replacement?: { masterCylinder?, axles?: { front?, rear? } } }
 * -> the hydraulic chain for the original and the replacement, the comparison in percent, circuit failure,
 *    findings ordered by severity, inputs, units, assumptions and cautions (shared/utils/brake computeHydraulics).
 * 401 signed out; 422 with `data.fields` keyed by field path when any part of the input is impossible
 * (nothing is computed from half an input).
 */
import { computeHydraulics, parseHydraulicsInput } from '#shared/utils/brake'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'calculations.use')
  return computeHydraulics(await bodyParsedBy(event, parseHydraulicsInput))
})

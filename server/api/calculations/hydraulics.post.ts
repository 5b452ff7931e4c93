/**
 * POST /api/calculations/hydraulics
 * Body (SI units): { pedalForceN, pedalRatio, boosterRatio, boosterRunOutKPa?, tyreRoadFriction?,
 *   masterCylinder: { boreMm, strokeMm? }, split, massKg?, vehicle?: { massKg, wheelbaseMm, cogHeightMm,
 *   frontStaticSharePercent, laden?, rearValve?, electronicDistribution? }, axles: { front: AXLE, rear: AXLE },
 *   replacement?: { masterCylinder?, axles?: { front?, rear? } } }; a disc AXLE takes padHeightMm? and edgeMarginMm?,
 *   a drum AXLE shoeLayout? or brakeFactor?.
 * -> the chain for the original and the replacement (per axle effectiveRadiusMm and how it was obtained), the
 *    deceleration capped by tyre grip (`decelerationMps2`) and `adhesion: { front, rear, locksFirst }` at it, the
 *    comparison in percent, the order of locking per load state (UN ECE R13-H Annex 5), the FMVSS No. 135 service
 *    stop, circuit failure, findings ordered by severity, inputs, units, assumptions and cautions
 *    (shared/utils/brake computeHydraulics).
 * 401 signed out; 422 with `data.fields` keyed by field path when any part of the input is impossible
 * (nothing is computed from half an input).
 */
import { computeHydraulics, parseHydraulicsInput } from '#shared/utils/brake'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'calculations.use')
  return computeHydraulics(await bodyParsedBy(event, parseHydraulicsInput))
})

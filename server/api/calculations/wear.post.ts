/**
 * POST /api/calculations/wear
 * Body: { discs?: [{ position, thicknessReadingsMm[], minThicknessMm, runoutMm?, ... }], pads?: [{ axle, innerMm,
 *   outerMm }], drums?: [{ position, diameterMm, maxDiameterMm }], fluid?: { gradeInSystem?, gradeToAdd?,
 *   specifiedGrade?, waterPercent? } }
 * -> a verdict per item (ok / advise / fail), the overall verdict and the part types to replace per axle
 *    (shared/utils/brake computeWear). Nothing is stored: POST /api/inspections records an inspection.
 * 401 signed out; 422 with `data.fields` keyed by field path.
 */
import { computeWear, parseWearInput } from '#shared/utils/brake'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'calculations.use')
  return computeWear(await bodyParsedBy(event, parseWearInput))
})

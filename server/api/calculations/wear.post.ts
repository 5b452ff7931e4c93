/**
 * POST /api/calculations/wear
 * Body: { discs?: [{ position, thicknessReadingsMm[], minThicknessMm, refinishMinThicknessMm?, runoutMm?, ... }],
 *   pads?: [{ axle, side?, innerMm, outerMm }], drums?: [{ position, diameterMm, maxDiameterMm, machiningAllowanceMm? }],
 *   shoes?: [{ position, liningMm }], conditions?: [{ position, item, state, note? }], fluid?: { gradeInSystem?,
 *   gradeToAdd?, specifiedGrade?, waterPercent?, boilingPointC?, ageMonths? }, brakeTest?: BRAKE-TEST BODY }
 * -> a verdict per item (ok / advise / fail) named by its wheel, the overall verdict, the brake tester's figures and
 *    the part types to replace per axle (shared/utils/brake computeWear). Nothing is stored: POST /api/inspections
 *    records an inspection.
 * 401 signed out; 422 with `data.fields` keyed by field path.
 */
import { computeWear, parseWearInput } from '#shared/utils/brake'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'calculations.use')
  return computeWear(await bodyParsedBy(event, parseWearInput))
})

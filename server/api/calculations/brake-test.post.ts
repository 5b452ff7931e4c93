/**
 * POST /api/calculations/brake-test
 * Body: { massKg, readings: [{ wheel: 'front_left' | 'front_right' | 'rear_left' | 'rear_right', serviceN, parkingN? }],
 *   limits?: { serviceEfficiencyPercent?, parkingEfficiencyPercent?, imbalancePercent? } }
 * -> { serviceEfficiencyPercent, parkingEfficiencyPercent, imbalancePercent: { front, rear }, verdicts, limits,
 *    inputs, assumptions } (shared/utils/brake computeBrakeTest: efficiency = Σ forces / (m g), imbalance per axle
 *    = (higher − lower) / higher, against the MOT pass marks unless other limits are given). Nothing is stored.
 * 401 signed out; 403 a garage not in good standing; 422 with `data.fields` keyed by field path.
 */
import { computeBrakeTest, parseBrakeTestInput } from '#shared/utils/brake'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'calculations.use')
  return computeBrakeTest(await bodyParsedBy(event, parseBrakeTestInput))
})

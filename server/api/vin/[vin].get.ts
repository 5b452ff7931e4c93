/**
 * GET /api/vin/:vin -> VinAnswer `{ valid, checkDigit: 'valid' | 'invalid' | 'not_used', modelYears: [...], maker,
 * candidates, ... }`: the VIN read as ISO 3779 with the 49 CFR 565 check digit where the region uses it, the model
 * years of its 10th character (both when it cannot tell), the maker from the WMI table and the catalogue vehicles
 * of that maker for those years. 401; 403 without `catalogue.view`; 422 naming `vin` for a malformed VIN.
 */
import { VinParamsSchema } from '#shared/schemas/garage-vehicles'
import { vinAnswer } from '../../services/garage-vehicles/vin-reading'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'catalogue.view')
  const { vin } = paramsWith(event, VinParamsSchema)
  return vinAnswer(vin)
})

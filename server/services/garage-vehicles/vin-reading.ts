/**
 * GET /api/vin/:vin's answer: the VIN read by shared/utils/vehicles/vin.ts (check digit, model years), the maker
 * from the WMI table of the catalogue data, and the catalogue vehicles of that maker for those years. Plain Node.
 */
import { WmiCode } from '../../models/garage-vehicles'
import { readVin } from '../../../shared/utils/vehicles/vin'
import type { VinAnswer } from '../../../shared/types/garage-vehicles'
import { matchCatalogue } from './catalogue-match'

/** Reads a VIN already of the ISO 3779 shape (the schema refuses others). */
export async function vinAnswer(vin: string, now = new Date()): Promise<VinAnswer> {
  const reading = readVin(vin, now)
  const wmi = await WmiCode.findByPk(reading.wmi)
  const maker = wmi ? { wmi: wmi.wmi, make: wmi.make, country: wmi.country } : null
  const candidates = maker && reading.valid ? await matchCatalogue({ make: maker.make, years: reading.modelYears }) : []
  return {
    vin: reading.vin, valid: reading.valid, checkDigit: reading.checkDigit, expectedCheckDigit: reading.expectedCheckDigit,
    warning: reading.warning, region: reading.region, modelYears: reading.modelYears, maker, candidates,
  }
}

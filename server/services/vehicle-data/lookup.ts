/**
 * GET /api/registrations/:registration: the vehicle-data service's record mapped to the catalogue, remembered per
 * garage (a garage sees the same cars again and again; another garage's look-up never answers from this one's
 * memory). When the service knows nothing (404) or cannot answer (503) the manual finder stays the way in: the
 * error carries what the mark itself tells (the age identifier of the configured national format) so the finder
 * can narrow the year. Unknown marks are remembered briefly; failures never are. Plain Node.
 */
import { DomainError } from '../errors'
import { registrationAge, type RegistrationFormat } from '../../../shared/utils/vehicles/registration'
import type { RegistrationAnswer, RegistrationFallback } from '../../../shared/types/garage-vehicles'
import { matchCatalogue } from '../garage-vehicles/catalogue-match'
import { fetchVehicleRecord, VehicleDataUnavailable, type VehicleDataConfig, type VehicleRecord } from './client'

const FOUND_TTL_MS = 24 * 3_600_000
const UNKNOWN_TTL_MS = 10 * 60_000
const MAX_ENTRIES = 5_000

const cache = new Map<string, { at: number; record: VehicleRecord | null }>()

export function clearRegistrationCache(): void { cache.clear() }

const titleCase = (s: string) => s.toLowerCase().replace(/(^|[\s-])\p{L}/gu, (m) => m.toUpperCase())

/** The years the mark itself allows (from its first and last possible month of first registration). */
export function fallbackOf(registration: string, format: RegistrationFormat): RegistrationFallback {
  const age = registrationAge(registration, format)
  const years: number[] = []
  if (age) for (let y = Number(age.from.slice(0, 4)); y <= Number(age.to.slice(0, 4)); y++) years.push(y)
  return { registration, age, years }
}

async function cachedRecord(organisationId: number, registration: string, config: VehicleDataConfig, now: number): Promise<{ record: VehicleRecord | null; cached: boolean }> {
  const key = `${organisationId}|${registration}`
  const hit = cache.get(key)
  if (hit && now - hit.at < (hit.record ? FOUND_TTL_MS : UNKNOWN_TTL_MS)) return { record: hit.record, cached: true }
  const record = await fetchVehicleRecord(config, registration)
  cache.delete(key)
  cache.set(key, { at: now, record })
  while (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value as string)
  return { record, cached: false }
}

/**
 * The registration's vehicle for one garage (the registration normalised by the schema).
 * @throws DomainError not_found (the service knows no such mark) or unavailable (down, slow), each with the fallback
 */
export async function lookUpRegistration(organisationId: number, registration: string, config: VehicleDataConfig, format: RegistrationFormat, now = Date.now()): Promise<RegistrationAnswer> {
  const fallback = fallbackOf(registration, format)
  let found: { record: VehicleRecord | null; cached: boolean }
  try {
    found = await cachedRecord(organisationId, registration, config, now)
  } catch (err) {
    if (!(err instanceof VehicleDataUnavailable)) throw err
    throw new DomainError('unavailable', `${err.message} Find the vehicle by make, model and year instead.`, { details: { fallback } })
  }
  const { record, cached } = found
  if (!record) {
    throw new DomainError('not_found', 'The vehicle-data service does not know this registration. Find the vehicle by make, model and year instead.', { details: { fallback } })
  }
  const year = record.yearOfManufacture ?? (record.firstRegistered ? Number(record.firstRegistered.slice(0, 4)) : null)
  const candidates = await matchCatalogue({
    make: record.make, model: record.model, years: year ? [year] : fallback.years,
    engineCc: record.engineCapacityCc, fuel: record.fuelType,
  })
  return {
    registration,
    reported: {
      make: titleCase(record.make), model: titleCase(record.model), variant: record.variant, yearOfManufacture: record.yearOfManufacture,
      firstRegistered: record.firstRegistered, engineCc: record.engineCapacityCc, fuel: record.fuelType.toLowerCase(), vin: record.vin, colour: titleCase(record.colour),
    },
    candidates,
    vehicleId: candidates.length === 1 ? candidates[0]!.id : null,
    age: fallback.age,
    cached,
  }
}

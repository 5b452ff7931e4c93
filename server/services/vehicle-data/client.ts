/**
 * The client of the hosted vehicle-data service (in the demo and tests: fakes/vehicle-data). One request per
 * registration, `GET <protocol>://<host>:<port>/v1/vehicles/<registration>` with the key in `x-api-key`, cut off
 * after `timeoutMs`. Its answer is checked with zod before use: a service that answers nonsense counts as down.
 * Plain Node: the configuration comes from the caller (server/utils/vehicle-data.ts reads the runtime config).
 */
import { z } from 'zod'

export interface VehicleDataConfig {
  protocol: string
  host: string
  port: number
  key: string
  timeoutMs: number
}

const VehicleRecord = z.object({
  registration: z.string(),
  make: z.string(),
  model: z.string(),
  variant: z.string().default(''),
  yearOfManufacture: z.number().int().nullable().default(null),
  firstRegistered: z.string().regex(/^\d{4}-\d{2}$/).nullable().default(null),
  engineCapacityCc: z.number().int().nullable().default(null),
  fuelType: z.string().default(''),
  colour: z.string().default(''),
  vin: z.string().nullable().default(null),
})
export type VehicleRecord = z.output<typeof VehicleRecord>

/** The service could not answer (down, slow, refused our key, or answered something unreadable). */
export class VehicleDataUnavailable extends Error {
  override readonly name = 'VehicleDataUnavailable'
}

/** The service's record for a registration, or null when it knows no such vehicle. */
export async function fetchVehicleRecord(config: VehicleDataConfig, registration: string): Promise<VehicleRecord | null> {
  const url = `${config.protocol}://${config.host}:${config.port}/v1/vehicles/${encodeURIComponent(registration)}`
  let res: Response
  try {
    res = await fetch(url, { headers: { 'x-api-key': config.key, accept: 'application/json' }, signal: AbortSignal.timeout(config.timeoutMs) })
  } catch (err) {
    const timedOut = err instanceof Error && (err.name === 'TimeoutError' || err.name === 'AbortError')
    throw new VehicleDataUnavailable(timedOut
      ? `The vehicle-data service did not answer within ${Math.round(config.timeoutMs / 100) / 10} s.`
      : 'The vehicle-data service cannot be reached.')
  }
  if (res.status === 404) return null
  if (!res.ok) {
    throw new VehicleDataUnavailable(res.status === 401 || res.status === 403
      ? 'The vehicle-data service refused our key: tell whoever runs Boreline.'
      : `The vehicle-data service is not answering properly (status ${res.status}).`)
  }
  const parsed = VehicleRecord.safeParse(await res.json().catch(() => null))
  if (!parsed.success) throw new VehicleDataUnavailable('The vehicle-data service answered something unreadable.')
  return parsed.data
}

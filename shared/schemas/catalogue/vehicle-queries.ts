/**
 * Queries about vehicles: the finder's facets (GET /api/vehicles/facets), the option answers a technician gives
 * (`?opt.<key>=<value>` on the vehicle's parts and on the bore-check prefill) and the prefill's own query.
 */
import { z } from 'zod'
import { optionalQuery, queryInt, queryText } from './fields'
import { SkuSchema } from './params'

export const VehicleFacetsQuerySchema = z.object({
  make: queryText('Make', 60),
  model: queryText('Model', 80),
  year: queryInt('Year', 1950, 2100),
}).refine((q) => !q.model || q.make, { path: ['make'], error: 'choose a make before a model' })
  .refine((q) => !q.year || q.model, { path: ['model'], error: 'choose a model before a year' })
export type VehicleFacetsQuery = z.infer<typeof VehicleFacetsQuerySchema>

/** Option answers come as `opt.<key>=<value>` query parameters, e.g. `?opt.front_disc_diameter_mm=300`. */
export const OPTION_PREFIX = 'opt.'

/** The option answers of a query; of a repeated parameter the last value counts, an empty one is no answer. */
export function answersFromQuery(query: Record<string, unknown>): Record<string, string> {
  const answers: Record<string, string> = {}
  for (const [k, v] of Object.entries(query)) {
    if (!k.startsWith(OPTION_PREFIX)) continue
    const value = Array.isArray(v) ? v[v.length - 1] : v
    if (value === undefined || value === null || value === '') continue
    answers[k.slice(OPTION_PREFIX.length)] = String(value)
  }
  return answers
}

/** GET /api/calculations/prefill: the vehicle, and the candidate part when there is one (answers ride along). */
export const PrefillQuerySchema = z.object({
  vehicleId: z.coerce.number({ error: 'vehicleId must be a number' }).int({ error: 'vehicleId must be a whole number' }).positive({ error: 'vehicleId is required' }),
  sku: optionalQuery(SkuSchema),
})

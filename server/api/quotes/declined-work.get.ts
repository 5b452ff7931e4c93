/**
 * GET /api/quotes/declined-work?registration=&vehicleId=&page=&pageSize=  -> Page<DeclinedSafetyWork>
 * The caller's garage's declined safety work, newest first: each line marked required that an owner declined,
 * with the statement they were shown and their signature (name, time, address). For a vehicle's history and
 * the follow-up reminders; `registration` ignores spaces and case.
 * 401 signed out; 403 without `quotes.draft`; 422 bad query.
 */
import { DeclinedWorkQuerySchema } from '#shared/schemas/quotes'
import { declinedSafetyWork } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const query = queryWith(event, DeclinedWorkQuerySchema)
  const { org } = requireAbility(event, 'quotes.draft')
  return declinedSafetyWork(org.id, query)
})

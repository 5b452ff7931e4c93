/**
 * GET /api/returns/lines/:lineId -> ReturnableLine: what may come back from one of the garage's sent lines (how
 * many, until when, from when the restocking charge applies). 401; 403 without `returns.request`; 404 not the
 * caller's line or not sent.
 */
import { z } from 'zod'
import { returnableLine } from '../../../services/returns/request'

const Params = z.object({ lineId: z.coerce.number().int().positive() })

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'returns.request')
  const { lineId } = paramsWith(event, Params)
  return returnableLine(org.id, lineId, requestClock(event))
})

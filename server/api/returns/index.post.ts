/**
 * POST /api/returns { orderLineId, quantity, reason: "wrong_part" | "not_needed" | "faulty", note?, fittedOn?,
 *   mileage?, fault? } -> 201 ReturnView
 * The garage asks to send parts back from a sent line: within the return period (faulty parts: the warranty
 * period, with the date fitted, the mileage and the fault; photos through POST /api/returns/:id/photos). An
 * unneeded part sent back late carries the restocking charge, fixed now. 401; 403 without `returns.request`;
 * 404 not the caller's line; 409 not sent yet or sent before invoices; 422 with `data.fields` (too many, too late,
 * missing fault details).
 */
import { ReturnRequestSchema } from '#shared/schemas/returns'
import { requestReturn } from '../../services/returns/request'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'returns.request')
  const input = await bodyWith(event, ReturnRequestSchema)
  const r = await requestReturn(org.id, user, input, requestClock(event), serverFormats())
  setResponseStatus(event, 201)
  return r
})

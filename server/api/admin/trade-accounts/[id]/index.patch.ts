/**
 * PATCH /api/admin/trade-accounts/:id { tierId?, terms?, creditLimitMinor?, paymentDays? } -> TradeAccountDetail.
 * Changes the tier and/or payment terms of an approved or suspended trade account. Distributor admin; 404 unknown;
 * 409 for pending or rejected garages (those are decided through the application) or a change meanwhile; 422 when
 * the terms would not agree or the tier is unknown. Audited with the fields that changed; the garage is e-mailed.
 */
import { IdParamSchema, TradeTermsSchema } from '#shared/schemas/accounts'
import { garageOr404 } from '../../../../services/trade-accounts'
import { changeTradeTerms } from '../../../../services/trade-account-changes'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, TradeTermsSchema)
  return changeTradeTerms(await garageOr404(id), body, user.id)
})

/**
 * POST /api/statement/card-payment { amountMinor } -> { url }: where to send the browser to pay that much of what
 * the garage owes on its trade account by card. Open to a suspended or stopped garage (paying is how it settles);
 * the payment is booked on the statement when the payment service confirms it.
 * 401; 403 without `orders.pay`; 422 (`data.fields.amountMinor`) not a positive whole amount or more than is owed;
 * 502 payment service down.
 */
import { AccountCardPaymentSchema } from '#shared/schemas/money-owed'
import { startAccountCardPayment } from '../../services/payments/account-card'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'orders.pay', { allowSuspended: true })
  const { amountMinor } = await bodyWith(event, AccountCardPaymentSchema)
  return startAccountCardPayment(org, user, amountMinor, serverFormats())
})

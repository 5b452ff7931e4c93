/**
 * POST /api/admin/trade-accounts/:id/payments { amountMinor, reference, receivedOn: 'YYYY-MM-DD', note? }
 * -> 201 { entryId, amountMinor, balanceMinor, availableMinor }. Books money a garage paid by transfer or cheque
 * against its ledger (the statement shows it as "Payment received"). Distributor admin only (403 otherwise);
 * 404 unknown garage; 422 with `data.fields` for bad input, a date in the future or an amount over what is owed;
 * 409 when the reference is already booked for this garage. The garage's managers get an e-mail.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { AccountPaymentSchema } from '#shared/schemas/orders'
import { recordAccountPayment } from '../../../../services/account-payments'
import { accountMail } from '../../../../services/account-mail'
import { garageRecipients } from '../../../../services/trade-accounts'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'payments.record')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, AccountPaymentSchema)
  const today = new Date().toISOString().slice(0, 10)
  if (body.receivedOn > today) {
    throw new DomainError('invalid', 'The date the money arrived cannot be in the future.', { fields: { receivedOn: 'The date the money arrived cannot be in the future.' } })
  }
  const out = await recordAccountPayment(id, body, user.id)
  await sendMail({
    to: await garageRecipients(out.org),
    ...accountMail.paymentReceived({
      businessName: out.org.name, amountMinor: out.amountMinor, reference: body.reference, receivedOn: body.receivedOn,
      balanceMinor: out.balanceMinor, availableMinor: out.availableMinor, statementUrl: appLink('/statement'),
    }, { currency: serverFormats().currency, locale: 'en-GB' }),
  })
  setResponseStatus(event, 201)
  return { entryId: out.entryId, amountMinor: out.amountMinor, balanceMinor: out.balanceMinor, availableMinor: out.availableMinor }
})

/**
 * Money a garage on account terms paid outside the card flow (bank transfer, cheque), booked by the distributor
 * against the garage's ledger: one negative `account_payment` entry, so the balance falls and the credit it frees
 * is usable for the next order at once. Refused: a date in the future (422), an unknown or non-garage account
 * (404), a payment larger than what is owed (422: an overpayment is almost always a typing slip; book the owed
 * amount and settle the rest by arrangement), the same reference twice for one garage (409, enforced by the
 * ledger's unique (kind, external id) even under concurrent requests). Audited; the garage's managers get an
 * e-mail after the commit. The admin may name which open items it pays (`allocations`, checked against what is
 * open); the rest settles the oldest first. Nitro only (the e-mail).
 */
import { UniqueConstraintError } from 'sequelize'
import { Organisation } from '../models/accounts'
import { LedgerEntry } from '../models/orders'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { appLink, sendMail } from '../utils/mail'
import type { AccountPaymentInput } from '../../shared/schemas/orders'
import type { Formats } from '../../shared/utils/format'
import { accountMail } from './account-mail'
import { garageRecipients } from './trade-accounts'
import { balanceOf } from './orders/credit'
import { localDate } from './orders/zoned-time'
import { checkAllocations, saveAllocations } from './payment-allocations'
import { DomainError, notFound } from './errors'

export interface AccountPaymentOutcome {
  entryId: number
  amountMinor: number
  balanceMinor: number
  availableMinor: number | null
}

/** The ledger's external id for a booked payment: one per garage and reference, whatever its spacing or case. */
export const paymentKey = (organisationId: number, reference: string) => `${organisationId}:${reference.replace(/\s+/g, ' ').trim().toUpperCase()}`

function book(organisationId: number, input: AccountPaymentInput, actorUserId: number, fmt: Formats): Promise<AccountPaymentOutcome & { org: Organisation }> {
  return withWrite(async (t) => {
    const org = await Organisation.findByPk(organisationId, { transaction: t })
    if (!org || org.kind !== 'garage') throw notFound('Trade account')
    const owed = await balanceOf(org.id, t)
    if (input.amountMinor > owed) {
      const m = fmt.money
      const message = owed > 0
        ? `${org.name} owes ${m(owed)}: a payment of ${m(input.amountMinor)} would put the account in credit. Book at most ${m(owed)}.`
        : `${org.name} owes nothing at the moment (balance ${m(owed)}), so there is nothing to book a payment against.`
      throw new DomainError('invalid', message, { fields: { amountMinor: message }, details: { balanceMinor: owed } })
    }
    await checkAllocations(t, org, input.allocations ?? [], localDate(new Date(), fmt.timeZone), fmt)
    const entry = await LedgerEntry.create({
      organisationId: org.id, orderId: null, kind: 'account_payment', amountMinor: -input.amountMinor,
      reference: input.reference, description: `Payment received ${input.receivedOn}${input.note ? ` · ${input.note}` : ''}`.slice(0, 300),
      externalId: paymentKey(org.id, input.reference),
    }, { transaction: t })
    await saveAllocations(t, org.id, entry.id, input.allocations ?? [])
    const balanceMinor = owed - input.amountMinor
    await audit(t, {
      actorUserId, organisationId: org.id, entity: 'ledger_entry', entityId: entry.id, action: 'tradeAccount.payment_recorded',
      changes: { amountMinor: input.amountMinor, reference: input.reference, receivedOn: input.receivedOn, allocations: input.allocations ?? 'oldest first', balanceMinor: { from: owed, to: balanceMinor } },
    })
    const availableMinor = org.paymentTerms === 'account' ? (org.creditLimitMinor ?? 0) - balanceMinor : null
    return { entryId: entry.id, amountMinor: input.amountMinor, balanceMinor, availableMinor, org }
  })
}

export async function recordAccountPayment(organisationId: number, input: AccountPaymentInput, actorUserId: number, fmt: Formats): Promise<AccountPaymentOutcome> {
  // the date the money arrived, as the bank statement shows it (UTC calendar day, like the statement's months)
  if (input.receivedOn > new Date().toISOString().slice(0, 10)) {
    const message = 'The date the money arrived cannot be in the future.'
    throw new DomainError('invalid', message, { fields: { receivedOn: message } })
  }
  let booked: AccountPaymentOutcome & { org: Organisation }
  try {
    booked = await book(organisationId, input, actorUserId, fmt)
  } catch (err) {
    if (err instanceof UniqueConstraintError) {
      const message = `A payment with reference ${input.reference} is already booked for this garage. Check the statement before booking it again.`
      throw new DomainError('conflict', message, { fields: { reference: message } })
    }
    throw err
  }
  const { org, ...outcome } = booked
  await sendMail({
    to: await garageRecipients(org),
    ...accountMail.paymentReceived({
      businessName: org.name, amountMinor: outcome.amountMinor, reference: input.reference, receivedOn: input.receivedOn,
      balanceMinor: outcome.balanceMinor, availableMinor: outcome.availableMinor, statementUrl: appLink('/statement'),
    }, fmt),
  })
  return outcome
}

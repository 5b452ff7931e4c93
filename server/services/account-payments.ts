/**
 * Money a garage on account terms paid outside the card flow (bank transfer, cheque), booked by the distributor
 * against the garage's ledger: one negative `account_payment` entry, so the balance falls and the credit it frees
 * is usable for the next order at once. Refused: an unknown or non-garage account (404), a payment larger than
 * what is owed (422: an overpayment is almost always a typing slip; book the owed amount and settle the rest by
 * arrangement), the same reference twice for one garage (409, enforced by the ledger's unique (kind, external id)
 * even under concurrent requests). Audited; the garage's managers get an e-mail after the commit. Plain Node.
 */
import { UniqueConstraintError } from 'sequelize'
import { Organisation } from '../models/accounts'
import { LedgerEntry } from '../models/orders'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { formatMinor } from '../../shared/utils/money'
import type { AccountPaymentInput } from '../../shared/schemas/orders'
import { balanceOf, ORDER_CURRENCY } from './orders'
import { DomainError, notFound, conflict } from './errors'

export interface AccountPaymentOutcome {
  entryId: number
  amountMinor: number
  balanceMinor: number
  availableMinor: number | null
  org: Organisation
}

const money = (minor: number) => formatMinor(minor, ORDER_CURRENCY, 'en-GB')
/** The ledger's external id for a booked payment: one per garage and reference, whatever its spacing or case. */
export const paymentKey = (organisationId: number, reference: string) => `${organisationId}:${reference.replace(/\s+/g, ' ').trim().toUpperCase()}`

export async function recordAccountPayment(organisationId: number, input: AccountPaymentInput, actorUserId: number): Promise<AccountPaymentOutcome> {
  try {
    return await withWrite(async (t) => {
      const org = await Organisation.findByPk(organisationId, { transaction: t })
      if (!org || org.kind !== 'garage') throw notFound('Trade account')
      const owed = await balanceOf(org.id, t)
      if (input.amountMinor > owed) {
        const message = owed > 0
          ? `${org.name} owes ${money(owed)}: a payment of ${money(input.amountMinor)} would put the account in credit. Book at most ${money(owed)}.`
          : `${org.name} owes nothing at the moment (balance ${money(owed)}), so there is nothing to book a payment against.`
        throw new DomainError('invalid', message, { fields: { amountMinor: message }, details: { balanceMinor: owed } })
      }
      const entry = await LedgerEntry.create({
        organisationId: org.id, orderId: null, kind: 'account_payment', amountMinor: -input.amountMinor,
        reference: input.reference, description: `Payment received ${input.receivedOn}${input.note ? ` · ${input.note}` : ''}`.slice(0, 300),
        externalId: paymentKey(org.id, input.reference),
      }, { transaction: t })
      await audit(t, {
        actorUserId, organisationId: org.id, entity: 'ledger_entry', entityId: entry.id, action: 'account.payment_recorded',
        changes: { amountMinor: input.amountMinor, reference: input.reference, receivedOn: input.receivedOn, balanceMinor: { from: owed, to: owed - input.amountMinor } },
      })
      const balanceMinor = owed - input.amountMinor
      return {
        entryId: entry.id, amountMinor: input.amountMinor, balanceMinor, org,
        availableMinor: org.paymentTerms === 'account' ? (org.creditLimitMinor ?? 0) - balanceMinor : null,
      }
    })
  } catch (err) {
    if (err instanceof UniqueConstraintError) {
      const message = `A payment with reference ${input.reference} is already booked for this garage. Check the statement before booking it again.`
      throw new DomainError('conflict', message, { fields: { reference: message } })
    }
    throw err
  }
}

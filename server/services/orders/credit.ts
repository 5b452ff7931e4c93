/**
 * The trade account: what a garage owes (the sum of its ledger, positive = owed to the distributor) and whether
 * an order on account fits under its credit limit. Plain Node.
 */
import type { Transaction } from 'sequelize'
import type { Organisation } from '../../models/accounts'
import { LedgerEntry } from '../../models/orders'
import type { Formats } from '../../../shared/utils/format'
import { DomainError } from '../errors'
import { assertNotOnStop } from '../account-stop'

export async function balanceOf(organisationId: number, t?: Transaction): Promise<number> {
  const sum = await LedgerEntry.sum('amountMinor', { where: { organisationId }, transaction: t })
  return Number(sum ?? 0) || 0
}

export interface CreditCheck { creditLimitMinor: number; balanceMinor: number; availableMinor: number; fits: boolean }

export async function creditCheck(org: Organisation, totalMinor: number, t?: Transaction): Promise<CreditCheck> {
  const balanceMinor = await balanceOf(org.id, t)
  const creditLimitMinor = org.creditLimitMinor ?? 0
  return { creditLimitMinor, balanceMinor, availableMinor: creditLimitMinor - balanceMinor, fits: balanceMinor + totalMinor <= creditLimitMinor }
}

/**
 * Refuses an order on account unless the garage has account terms (422 on `payment`), the account is not on stop
 * (402 with the reasons and the amount that clears it: account-stop.ts) and the balance plus this order stays
 * within the limit (402 naming the limit, the balance and what is left).
 */
export async function assertAccountFits(org: Organisation, totalMinor: number, fmt: Formats, t?: Transaction, now = new Date()): Promise<void> {
  if (org.paymentTerms !== 'account') {
    throw new DomainError('invalid', `${org.name} pays by card: ordering on trade account is not set up. Choose card payment.`, { fields: { payment: 'This garage pays by card; trade-account terms are not set up.' } })
  }
  await assertNotOnStop(org, { now, timeZone: fmt.timeZone }, fmt, t)
  const c = await creditCheck(org, totalMinor, t)
  if (c.fits) return
  const m = fmt.money
  throw new DomainError('payment_required', `Not enough trade credit: this order is ${m(totalMinor)}, the account balance is ${m(c.balanceMinor)} and the credit limit is ${m(c.creditLimitMinor)} (${m(Math.max(0, c.availableMinor))} available). Pay by card, or settle the account first.`, {
    fields: { payment: 'Over the trade-account credit limit.' },
    details: { creditLimitMinor: c.creditLimitMinor, balanceMinor: c.balanceMinor, availableMinor: c.availableMinor, orderTotalMinor: totalMinor },
  })
}

/**
 * The account stop: a garage on account terms whose balance is over its credit limit, or with an item overdue by
 * more than BORELINE_STOP_OVERDUE_DAYS (default 30) days, may not order on account until it pays (card orders
 * still go through). Nothing is stored about the stop itself: it is worked out from the ledger every time, so it
 * ends by itself the moment a payment clears it. The distributor admin may lift it for up to
 * BORELINE_STOP_LIFT_MAX_DAYS (default 30) days with a reason; the lift is audited and ends by itself. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Organisation } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import type { AccountStop, OpenItem } from '../../shared/types/money-owed'
import type { Formats } from '../../shared/utils/format'
import type { StopLiftInput } from '../../shared/schemas/money-owed'
import { localDate } from './orders/zoned-time'
import type { ViewClock } from './orders/clock'
import { dayPlus, openItemsOf } from './ageing'
import { owedLedger } from './owed-moves'
import { DomainError, notFound } from './errors'

function whole(value: string | undefined, fallback: number, max: number): number {
  const n = Number(value)
  return value && Number.isInteger(n) && n >= 0 && n <= max ? n : fallback
}

export const stopSettings = (env: NodeJS.ProcessEnv = process.env) => ({
  stopAfterDays: whole(env.BORELINE_STOP_OVERDUE_DAYS, 30, 3650),
  liftMaxDays: whole(env.BORELINE_STOP_LIFT_MAX_DAYS, 30, 365) || 30,
})

/** The stop as it stands on `today`, from the balance and the open items (pure). */
export function stopFrom(
  org: Pick<Organisation, 'paymentTerms' | 'creditLimitMinor' | 'stopLiftedUntil' | 'stopLiftReason'>,
  balanceMinor: number, items: readonly OpenItem[], today: string, fmt: Formats, stopAfterDays = stopSettings().stopAfterDays,
): AccountStop {
  const onAccount = org.paymentTerms === 'account'
  const overLimitMinor = onAccount ? Math.max(0, balanceMinor - (org.creditLimitMinor ?? 0)) : 0
  const longOverdue = onAccount ? items.filter((i) => i.daysOverdue > stopAfterDays) : []
  const longOverdueMinor = longOverdue.reduce((s, i) => s + i.openMinor, 0)
  const reasons: string[] = []
  if (overLimitMinor > 0) reasons.push(`The balance of ${fmt.money(balanceMinor)} is ${fmt.money(overLimitMinor)} over the credit limit of ${fmt.money(org.creditLimitMinor ?? 0)}.`)
  if (longOverdue.length > 0) {
    const refs = longOverdue.map((i) => i.reference).join(', ')
    reasons.push(`${fmt.money(longOverdueMinor)} is overdue by more than ${stopAfterDays} days (${refs}).`)
  }
  const lift = org.stopLiftedUntil && org.stopLiftedUntil >= today ? { until: org.stopLiftedUntil, reason: org.stopLiftReason ?? '' } : null
  // payments settle the oldest items first, so paying the larger of the two ends both
  const amountToClearMinor = Math.max(overLimitMinor, longOverdueMinor)
  return { onStop: reasons.length > 0 && !lift, reasons, amountToClearMinor, overLimitMinor, longOverdueMinor, stopAfterDays, lift }
}

/** What the garage owes on the clock's local day: the balance and the open items, oldest first. */
export async function owedNow(org: Organisation, clock: ViewClock, t?: Transaction): Promise<{ today: string; balanceMinor: number; items: OpenItem[] }> {
  const { moves, allocations } = await owedLedger(org.id, clock.timeZone, t)
  const today = localDate(clock.now, clock.timeZone)
  return { today, balanceMinor: moves.reduce((s, m) => s + m.amountMinor, 0), items: openItemsOf(moves, org.paymentDays ?? 0, today, allocations) }
}

export async function accountStopOf(org: Organisation, clock: ViewClock, fmt: Formats, t?: Transaction): Promise<AccountStop> {
  const { today, balanceMinor, items } = await owedNow(org, clock, t)
  return stopFrom(org, balanceMinor, items, today, fmt)
}

/** 402 naming every reason and the amount that clears the stop, when the account is on stop. */
export async function assertNotOnStop(org: Organisation, clock: ViewClock, fmt: Formats, t?: Transaction): Promise<void> {
  const stop = await accountStopOf(org, clock, fmt, t)
  if (!stop.onStop) return
  const message = `This trade account is on stop: ${stop.reasons.join(' ')} Pay ${fmt.money(stop.amountToClearMinor)} to order on account again, or pay for this order by card.`
  throw new DomainError('payment_required', message, {
    fields: { payment: 'The trade account is on stop; card payment still works.' },
    details: { stop },
  })
}

/** The admin lifts the stop until the end of a day within the allowed span, with a reason (audited). */
export function liftStop(organisationId: number, input: StopLiftInput, actorUserId: number, clock: ViewClock, fmt: Formats): Promise<AccountStop> {
  const { liftMaxDays } = stopSettings()
  if (input.days > liftMaxDays) {
    const message = `A stop can be lifted for at most ${liftMaxDays} days.`
    throw new DomainError('invalid', message, { fields: { days: message } })
  }
  return withWrite(async (t) => {
    const org = await Organisation.findByPk(organisationId, { transaction: t })
    if (!org || org.kind !== 'garage') throw notFound('Trade account')
    const until = dayPlus(localDate(clock.now, clock.timeZone), input.days)
    const before = { until: org.stopLiftedUntil ?? null, reason: org.stopLiftReason ?? null }
    await org.update({ stopLiftedUntil: until, stopLiftReason: input.reason }, { transaction: t })
    await audit(t, {
      actorUserId, organisationId: org.id, entity: 'organisation', entityId: org.id, action: 'tradeAccount.stop_lifted',
      changes: { stopLiftedUntil: { from: before.until, to: until }, stopLiftReason: { from: before.reason, to: input.reason } },
    })
    return accountStopOf(org, clock, fmt, t)
  })
}

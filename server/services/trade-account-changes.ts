/**
 * What the distributor admin changes on a garage: its tier and payment terms, its suspension and reactivation
 * (and, through trade-applications.ts, the decision on its application). Every change moves the row with a
 * guarded UPDATE (… WHERE status = the status it was read with), so two admins cannot both act on one state; it is
 * audited in the same transaction, and the garage's managers are e-mailed after the commit. Plain Node.
 */
import { Organisation } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { appLink, sendMail } from '../utils/mail'
import { serverFormats } from '../utils/format'
import { termsDisagreements, type TradeTermsInput } from '../../shared/schemas/accounts'
import type { TradeAccountDetail } from '../../shared/types/trade-accounts'
import { accountMail, termsSentence, type MailContent } from './account-mail'
import { changedFields } from './audit-changes'
import { chosenTier } from './discount-tiers'
import { conflict, invalidInput } from './errors'
import { findGarage, garageRecipients, tierLabel, tradeAccountDetail, type Garage } from './trade-accounts'

type GarageValues = Parameters<typeof Organisation.update>[0]

interface AuditedChange {
  action: string
  changes: Record<string, unknown>
  actorId: number
  /** the 409 message when someone else moved the garage first */
  stale?: string
}

/** Writes `values` if the garage is still in the status it was read with, audits it, and returns the garage anew. */
export async function commitGarageChange(garage: Garage, values: GarageValues, entry: AuditedChange): Promise<Garage> {
  await withWrite(async (t) => {
    const [changed] = await Organisation.update(values, { where: { id: garage.id, status: garage.status }, transaction: t })
    if (changed !== 1) throw conflict(entry.stale ?? 'The trade account changed meanwhile; reload and try again.')
    await audit(t, { actorUserId: entry.actorId, organisationId: garage.id, entity: 'organisation', entityId: garage.id, action: entry.action, changes: entry.changes })
  })
  return (await findGarage(garage.id))!
}

/** E-mails the garage's managers (after the commit: a failed send never undoes the change). */
export async function tellGarage(garage: Garage, mail: MailContent): Promise<void> {
  await sendMail({ to: await garageRecipients(garage), ...mail })
}

/** The terms sentence of the e-mails, in the installation's money. */
export function termsOf(garage: Garage): string {
  return termsSentence(garage.paymentTerms, garage.creditLimitMinor, garage.paymentDays, serverFormats().money)
}

/**
 * Changes the tier and/or payment terms of an approved or suspended trade account (409 for pending or rejected:
 * those are decided through the application). The terms must agree once changed (422); going to card drops the
 * credit limit and the days to pay. Only the fields that change are audited; nothing changing changes nothing.
 */
export async function changeTradeTerms(garage: Garage, input: TradeTermsInput, actorId: number): Promise<TradeAccountDetail> {
  if (garage.status !== 'approved' && garage.status !== 'suspended') {
    throw conflict('Only approved or suspended trade accounts have terms to change; decide the application first.')
  }
  const tier = input.tierId ? await chosenTier(input.tierId) : garage.tier ?? null
  const terms = input.terms ?? garage.paymentTerms
  const next = {
    tierId: tier?.id ?? null,
    paymentTerms: terms,
    creditLimitMinor: terms === 'card' ? 0 : (input.creditLimitMinor ?? garage.creditLimitMinor),
    paymentDays: terms === 'card' ? 0 : (input.paymentDays ?? garage.paymentDays),
  }
  // account terms are checked as they end up; card terms refuse a limit or days sent with them
  const problems = termsDisagreements(terms === 'account'
    ? { terms, creditLimitMinor: next.creditLimitMinor, paymentDays: next.paymentDays }
    : { terms, creditLimitMinor: input.creditLimitMinor, paymentDays: input.paymentDays })
  if (Object.keys(problems).length) throw invalidInput(problems)

  const before = { tierId: garage.tierId ?? null, paymentTerms: garage.paymentTerms, creditLimitMinor: garage.creditLimitMinor, paymentDays: garage.paymentDays }
  const changes = changedFields(before, next)
  if (!Object.keys(changes).length) return tradeAccountDetail(garage)
  if (changes.tierId) changes.tierId = { from: garage.tier ? tierLabel(garage.tier) : null, to: tierLabel(tier!) }

  const fresh = await commitGarageChange(garage, next, { action: 'tradeAccount.terms_changed', changes, actorId })
  await tellGarage(fresh, accountMail.termsChanged({
    businessName: fresh.name, tierName: fresh.tier?.name ?? 'none', percentBp: fresh.tier?.percentBp ?? 0, terms: termsOf(fresh),
  }))
  return tradeAccountDetail(fresh)
}

export type StandingChange = { move: 'suspend'; reason: string } | { move: 'reactivate'; note?: string }

/**
 * Suspends an approved trade account or reactivates a suspended one (409 otherwise). A suspension bites on the
 * garage's next request (its standing is read from the database every time) and its people still read the
 * reason on their status page.
 */
export async function changeStanding(garage: Garage, change: StandingChange, actorId: number): Promise<TradeAccountDetail> {
  const suspend = change.move === 'suspend'
  const [from, to] = suspend ? ['approved', 'suspended'] as const : ['suspended', 'approved'] as const
  if (garage.status !== from) {
    throw conflict(suspend
      ? `Only an approved trade account can be suspended (this one is ${garage.status}).`
      : `Only a suspended trade account can be reactivated (this one is ${garage.status}).`)
  }
  const why = suspend ? { reason: change.reason } : change.note ? { note: change.note } : {}
  const fresh = await commitGarageChange(garage, { status: to, decisionReason: suspend ? change.reason : null }, {
    action: suspend ? 'tradeAccount.suspended' : 'tradeAccount.reactivated', changes: { status: { from, to }, ...why }, actorId,
  })
  await tellGarage(fresh, suspend
    ? accountMail.suspended({ businessName: fresh.name, reason: change.reason })
    : accountMail.reactivated({ businessName: fresh.name, signInUrl: appLink('/sign-in') }))
  return tradeAccountDetail(fresh)
}

/**
 * Reading garages for the distributor: the paginated list behind the applications queue and the accounts
 * list, and the detail (document, people, decision history). Serialisers give the shapes in
 * shared/types/trade-accounts.ts.
 */
import { Op, Sequelize, type Order, type WhereOptions } from 'sequelize'
import { AuditEntry, DiscountTier, Organisation, User } from '../models/accounts'
import { ProofDocument } from '../models/accounts-extra'
import { LedgerEntry } from '../models/orders'
import type { TradeAccountListQuery } from '../../shared/schemas/accounts'
import type { AuditView, TradeAccountDetail, TradeAccountSummary, PageOf, PersonView, ProofDocumentView, TierView } from '../../shared/types/trade-accounts'

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null)

export function tierView(t: DiscountTier | null | undefined): TierView | null {
  return t ? { id: t.id, name: t.name, percentBp: t.percentBp } : null
}

export function personView(u: User): PersonView {
  return { id: u.id, name: u.name, email: u.email, phone: u.phone ?? '', role: u.role, status: u.status, lastSignInAt: iso(u.lastSignInAt) }
}

export function tradeAccountSummary(o: Organisation & { tier?: DiscountTier | null }): TradeAccountSummary {
  return {
    id: o.id, name: o.name, status: o.status, contactName: o.contactName, email: o.email,
    submittedAt: iso(o.createdAt)!, decidedAt: iso(o.decidedAt),
    tier: tierView(o.tier), terms: o.paymentTerms, creditLimitMinor: o.creditLimitMinor, paymentDays: o.paymentDays,
  }
}

const ORDER: Record<string, Order> = {
  'submitted': [['createdAt', 'ASC'], ['id', 'ASC']],
  '-submitted': [['createdAt', 'DESC'], ['id', 'DESC']],
  'name': [['name', 'ASC'], ['id', 'ASC']],
  '-name': [['name', 'DESC'], ['id', 'DESC']],
  'decided': [['decidedAt', 'ASC'], ['id', 'ASC']],
  '-decided': [['decidedAt', 'DESC'], ['id', 'DESC']],
}

/** Case-insensitive "contains" without LIKE, so % and _ in the search are plain characters. */
function contains(column: string, q: string) {
  return Sequelize.where(Sequelize.fn('instr', Sequelize.fn('lower', Sequelize.col(`Organisation.${column}`)), q.toLowerCase()), Op.gt, 0)
}

/** Garages filtered by status and a search over name, contact and e-mail; sorted and paged on the server. */
export async function listTradeAccounts(query: TradeAccountListQuery, defaults: { status: TradeAccountListQuery['status']; sort: NonNullable<TradeAccountListQuery['sort']> }): Promise<PageOf<TradeAccountSummary>> {
  const status = query.status ?? defaults.status
  const where: WhereOptions = { kind: 'garage' }
  if (status && status !== 'all') Object.assign(where, { status })
  if (query.q) {
    const q = query.q
    Object.assign(where, { [Op.or]: ['name', 'contact_name', 'email', 'tax_number'].map((c) => contains(c, q)) })
  }
  const { page, pageSize } = query
  const { rows, count } = await Organisation.findAndCountAll({
    where,
    include: [{ model: DiscountTier, as: 'tier' }],
    order: ORDER[query.sort ?? defaults.sort],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  })
  return { data: rows.map((o) => tradeAccountSummary(o as Organisation & { tier?: DiscountTier | null })), meta: { page, pageSize, total: count } }
}

/** A garage by id (404 for the caller when null: ids of the distributor itself are not garages). */
export async function findGarage(id: number): Promise<(Organisation & { tier?: DiscountTier | null }) | null> {
  return Organisation.findOne({ where: { id, kind: 'garage' }, include: [{ model: DiscountTier, as: 'tier' }] }) as Promise<(Organisation & { tier?: DiscountTier | null }) | null>
}

export async function latestProof(organisationId: number): Promise<ProofDocument | null> {
  return ProofDocument.findOne({ where: { organisationId }, order: [['createdAt', 'DESC'], ['id', 'DESC']] })
}

export function proofView(d: ProofDocument | null): ProofDocumentView | null {
  return d ? { id: d.id, originalName: d.originalName, mime: d.mime, sizeBytes: d.sizeBytes, uploadedAt: iso(d.createdAt)! } : null
}

/** The audit trail of one record, newest first, with the actors' names. */
export async function historyOf(entity: string, entityId: number | string): Promise<AuditView[]> {
  const rows = await AuditEntry.findAll({ where: { entity, entityId: String(entityId) }, order: [['createdAt', 'DESC'], ['id', 'DESC']], limit: 200 })
  const actorIds = [...new Set(rows.map((r) => r.actorUserId).filter((v): v is number => v != null))]
  const actors = actorIds.length ? await User.findAll({ where: { id: { [Op.in]: actorIds } }, attributes: ['id', 'name'] }) : []
  const names = new Map(actors.map((a) => [a.id, a.name]))
  return rows.map((r) => {
    let changes: Record<string, unknown> = {}
    try { changes = JSON.parse(r.changes) } catch { /* kept as {} */ }
    return { id: r.id, at: iso(r.createdAt)!, action: r.action, actor: r.actorUserId == null ? null : (names.get(r.actorUserId) ?? `user ${r.actorUserId}`), changes }
  })
}

/** The garage in full; the decision history only for those who may read the audit log. */
export async function tradeAccountDetail(o: Organisation & { tier?: DiscountTier | null }, withHistory = true): Promise<TradeAccountDetail> {
  const [doc, people, history, balance] = await Promise.all([
    latestProof(o.id),
    User.findAll({ where: { organisationId: o.id }, order: [['name', 'ASC']] }),
    withHistory ? historyOf('organisation', o.id) : Promise.resolve([]),
    LedgerEntry.sum('amountMinor', { where: { organisationId: o.id } }),
  ])
  return {
    ...tradeAccountSummary(o),
    tradingAddress: o.tradingAddress, taxNumber: o.taxNumber, phone: o.phone, decisionReason: o.decisionReason ?? null,
    document: proofView(doc), people: people.map(personView), history, balanceMinor: Number(balance ?? 0) || 0,
  }
}

/** The managers who should hear about their garage's account (active people with the manager role). */
export async function garageRecipients(o: Organisation): Promise<string[]> {
  const managers = await User.findAll({ where: { organisationId: o.id, role: 'garage_manager', status: 'active' }, attributes: ['email'] })
  return [...new Set([o.email, ...managers.map((m) => m.email)].filter(Boolean).map((e) => e.toLowerCase()))]
}

/** `{ field: { from, to } }` for the fields whose value changes: what the audit log records. */
export function diff(before: Record<string, unknown>, after: Record<string, unknown>): Record<string, { from: unknown; to: unknown }> {
  const out: Record<string, { from: unknown; to: unknown }> = {}
  for (const k of Object.keys(after)) {
    if (after[k] !== undefined && before[k] !== after[k]) out[k] = { from: before[k] ?? null, to: after[k] }
  }
  return out
}

/**
 * Reading garages for the distributor: the paged list behind the applications queue and the trade-accounts list,
 * and the detail (document, people, decision history). Serialisers give the shapes in
 * shared/types/trade-accounts.ts. Plain Node.
 */
import { Op, type Order, type WhereOptions } from 'sequelize'
import { AuditEntry, Branch, DiscountTier, Organisation, User } from '../models/accounts'
import { ProofDocument } from '../models/accounts-extra'
import { LedgerEntry } from '../models/orders'
import { pageOf } from '../utils/page'
import { notFound } from './errors'
import { personView } from './staff'
import type { TradeAccountListQuery } from '../../shared/schemas/accounts'
import type { Page } from '../../shared/types/page'
import type { AuditView, TradeAccountDetail, TradeAccountSummary, ProofDocumentView, TierView } from '../../shared/types/trade-accounts'
import { containsText } from '../utils/sql'

/** A garage organisation with its discount tier loaded. */
export type Garage = Organisation & { tier?: DiscountTier | null }

export const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null)

export function tierView(t: DiscountTier | null | undefined): TierView | null {
  return t ? { id: t.id, name: t.name, percentBp: t.percentBp } : null
}

/** "Silver (12.5 %)": how the audit log names a tier. */
export function tierLabel(t: Pick<DiscountTier, 'name' | 'percentBp'>): string {
  return `${t.name} (${t.percentBp / 100} %)`
}

export function tradeAccountSummary(o: Garage): TradeAccountSummary {
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
  return containsText(`Organisation.${column}`, q)
}

/** Garages filtered by status and a search over name, contact, e-mail and tax number; sorted and paged on the server. */
export async function listTradeAccounts(
  query: TradeAccountListQuery,
  defaults: { status: TradeAccountListQuery['status']; sort: NonNullable<TradeAccountListQuery['sort']> },
): Promise<Page<TradeAccountSummary>> {
  const status = query.status ?? defaults.status
  const where: WhereOptions = { kind: 'garage' }
  if (status && status !== 'all') Object.assign(where, { status })
  if (query.q) {
    const q = query.q
    Object.assign(where, { [Op.or]: ['name', 'contact_name', 'email', 'tax_number'].map((c) => contains(c, q)) })
  }
  return pageOf(
    query,
    (window) => Organisation.findAndCountAll({ where, include: [{ model: DiscountTier, as: 'tier' }], order: ORDER[query.sort ?? defaults.sort], ...window }),
    (rows) => rows.map((o) => tradeAccountSummary(o as Garage)),
  )
}

/** A garage by id, or null (ids of the distributor itself are not garages). */
export async function findGarage(id: number): Promise<Garage | null> {
  return Organisation.findOne({ where: { id, kind: 'garage' }, include: [{ model: DiscountTier, as: 'tier' }] }) as Promise<Garage | null>
}

/** A garage by id; 404 naming `what` ("Trade account", "Application") when there is none. */
export async function garageOr404(id: number, what = 'Trade account'): Promise<Garage> {
  const garage = await findGarage(id)
  if (!garage) throw notFound(what)
  return garage
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
export async function tradeAccountDetail(o: Garage, withHistory = true): Promise<TradeAccountDetail> {
  const [doc, people, history, balance, home] = await Promise.all([
    latestProof(o.id),
    User.findAll({ where: { organisationId: o.id }, order: [['name', 'ASC']] }),
    withHistory ? historyOf('organisation', o.id) : Promise.resolve([]),
    LedgerEntry.sum('amountMinor', { where: { organisationId: o.id } }),
    o.homeBranchId ? Branch.findByPk(o.homeBranchId, { attributes: ['id', 'code', 'name'] }) : Promise.resolve(null),
  ])
  return {
    ...tradeAccountSummary(o),
    tradingAddress: o.tradingAddress, taxNumber: o.taxNumber, phone: o.phone, decisionReason: o.decisionReason ?? null,
    document: proofView(doc), people: people.map(personView), history, balanceMinor: Number(balance ?? 0) || 0,
    homeBranch: home ? { id: home.id, code: home.code, name: home.name } : null,
  }
}

/** The managers who should hear about their garage's trade account (active people with the manager role). */
export async function garageRecipients(o: Organisation): Promise<string[]> {
  const managers = await User.findAll({ where: { organisationId: o.id, role: 'garage_manager', status: 'active' }, attributes: ['email'] })
  return [...new Set([o.email, ...managers.map((m) => m.email)].filter(Boolean).map((e) => e.toLowerCase()))]
}

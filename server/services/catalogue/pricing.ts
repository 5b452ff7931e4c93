/**
 * Who sees which prices. Distributor staff: list price and trade cost. A garage manager: list price and the
 * garage's net price (list less its tier discount, `netPriceMinor`), plus core deposits (never discounted).
 * A technician: the same only when the garage's setting "technicians see trade prices" is on; otherwise no money
 * fields at all (absent, not zero). Plain Node.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { afterEveryWrite, getDb } from '../../utils/db'
import { can } from '../../../shared/utils/abilities'
import { netPriceMinor } from '../../../shared/utils/money'
import type { Organisation, User } from '../../models/accounts'
import { activePriceVersion, type ActivePriceVersion } from '../price-versions'

export type PriceView =
  | { kind: 'staff' }
  | { kind: 'garage'; discountBp: number }
  | { kind: 'none' }

export type { ActivePriceVersion }

export interface CatalogueRevision { catalogue: number; stock: number }

export interface PricingContext { view: PriceView; priceVersion: ActivePriceVersion | null; revision: CatalogueRevision }

interface ContextRow { priceVersion: ActivePriceVersion | null; bp: number | null; rev: number | null; stockRev: number | null }

/**
 * The active price version, the caller's tier discount and the catalogue revisions (bumped by triggers on every
 * catalogue or stock change, see migration 0004), remembered per tier and forgotten at once after any write
 * transaction in this process, so an apply, a rollback or a tier change counts from the next request.
 *
 * A remembered row older than {@link CONTEXT_TTL_MS} is still answered while one read in the background refreshes
 * it, so a change made by another process shows within about a second. Waiting for that read instead made every
 * request in flight queue behind it, and each of them started its own read: under 50 connections the vehicle-parts
 * route stalled for 100-400 ms once a second (bench/catalogue.ts). Only a request with nothing remembered (the first,
 * or the first after a write) waits, and concurrent ones share that one read.
 */
export async function pricingContext(user: Pick<User, 'role'>, org: Pick<Organisation, 'kind' | 'tierId' | 'techniciansSeePrices'>, now = Date.now()): Promise<PricingContext> {
  const tier = org.tierId ?? -1
  let row: ContextRow
  if (!contextCacheOn()) row = await readContextRow(tier)
  else {
    const hit = contextRows.get(tier)
    if (hit && now - hit.at >= CONTEXT_TTL_MS) void refreshContext(tier).catch(() => {}) // answered below meanwhile
    row = hit ? hit.row : await refreshContext(tier)
  }
  return {
    priceVersion: row.priceVersion, view: priceViewOf(user, org, Number(row.bp ?? 0)),
    revision: { catalogue: Number(row.rev ?? 0), stock: Number(row.stockRev ?? 0) },
  }
}

export const CONTEXT_TTL_MS = 1_000
const contextRows = new Map<number, { at: number; row: ContextRow }>()
const reading = new Map<number, Promise<ContextRow>>()
let writes = 0
afterEveryWrite(() => { writes++; contextRows.clear(); reading.clear() })
let cacheFlag: boolean | undefined
const contextCacheOn = () => (cacheFlag ??= process.env.BORELINE_CATALOGUE_CACHE !== '0')

/** One read per tier at a time; remembered only when no write ended while it ran. */
function refreshContext(tier: number): Promise<ContextRow> {
  let pending = reading.get(tier)
  if (pending) return pending
  const readAt = writes
  pending = readContextRow(tier).then((row) => {
    if (readAt === writes) contextRows.set(tier, { at: Date.now(), row })
    return row
  }).finally(() => { if (reading.get(tier) === pending) reading.delete(tier) })
  reading.set(tier, pending)
  return pending
}

async function readContextRow(tier: number): Promise<ContextRow> {
  // the revisions before the version: should an apply land between the two reads, the revision is the older
  // one, so the caches are rebuilt on the next request instead of keeping rows read under a newer revision
  const [rest] = await getDb().query<Omit<ContextRow, 'priceVersion'>>(
    `SELECT (SELECT percent_bp FROM discount_tiers WHERE id = :tier) AS bp,
            (SELECT catalogue FROM catalogue_revisions WHERE id = 1) AS rev,
            (SELECT stock FROM catalogue_revisions WHERE id = 1) AS stockRev`,
    { type: QueryTypes.SELECT, replacements: { tier } },
  )
  const priceVersion = await activePriceVersion()
  return { priceVersion, bp: rest?.bp ?? null, rev: rest?.rev ?? null, stockRev: rest?.stockRev ?? null }
}

/** The revisions inside a transaction (before and after a change). */
export async function readRevision(transaction?: Transaction): Promise<CatalogueRevision> {
  const [row] = await getDb().query<{ catalogue: number; stock: number }>('SELECT catalogue, stock FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT, transaction })
  return { catalogue: Number(row?.catalogue ?? 0), stock: Number(row?.stock ?? 0) }
}

export function priceViewOf(user: Pick<User, 'role'>, org: Pick<Organisation, 'kind' | 'techniciansSeePrices'>, discountBp: number): PriceView {
  if (!can(user.role, 'prices.view')) return { kind: 'none' }
  if (org.kind === 'distributor') return { kind: 'staff' }
  if (user.role === 'garage_technician' && !org.techniciansSeePrices) return { kind: 'none' }
  return { kind: 'garage', discountBp }
}

/** A stable key for caches: responses differ only by this. */
export function viewKey(view: PriceView): string {
  return view.kind === 'garage' ? `g${view.discountBp}` : view.kind
}

export interface StoredPrice { listPriceMinor: number; tradeCostMinor: number | null; coreDepositMinor: number }

/** The money fields this caller may see for one price row (empty object: none, or no price in the list). */
export function priceFields(view: PriceView, price: StoredPrice | null | undefined): Record<string, number> {
  if (!price || view.kind === 'none') return {}
  if (view.kind === 'staff') {
    const out: Record<string, number> = { listPriceMinor: price.listPriceMinor, coreDepositMinor: price.coreDepositMinor }
    if (price.tradeCostMinor != null) out.tradeCostMinor = price.tradeCostMinor
    return out
  }
  return { listPriceMinor: price.listPriceMinor, netPriceMinor: netPriceMinor(price.listPriceMinor, view.discountBp), coreDepositMinor: price.coreDepositMinor }
}

/** Prices in use of these parts (`priceVersionId`: the active version; nothing is priced without one). */
export async function pricesFor(priceVersionId: number | undefined, partIds: number[]): Promise<Map<number, StoredPrice>> {
  const out = new Map<number, StoredPrice>()
  if (!priceVersionId || !partIds.length) return out
  const rows = await getDb().query<{ partId: number } & StoredPrice>(
    `SELECT part_id AS partId, list_price_minor AS listPriceMinor, trade_cost_minor AS tradeCostMinor, core_deposit_minor AS coreDepositMinor
       FROM part_prices WHERE part_id IN (:ids)`,
    { type: QueryTypes.SELECT, replacements: { ids: partIds } },
  )
  for (const r of rows) out.set(r.partId, { listPriceMinor: r.listPriceMinor, tradeCostMinor: r.tradeCostMinor, coreDepositMinor: r.coreDepositMinor })
  return out
}

export interface BranchStock { branchCode: string; branchName: string; quantity: number }

/** Stock per branch for these parts (every branch listed, zero when there is no row). */
export async function stockFor(partIds: number[]): Promise<Map<number, BranchStock[]>> {
  const out = new Map<number, BranchStock[]>()
  if (!partIds.length) return out
  const db = getDb()
  const branches = await db.query<{ id: number; code: string; name: string }>('SELECT id, code, name FROM branches ORDER BY code', { type: QueryTypes.SELECT })
  const rows = await db.query<{ partId: number; branchId: number; quantity: number }>(
    'SELECT part_id AS partId, branch_id AS branchId, quantity FROM stock_levels WHERE part_id IN (:ids)',
    { type: QueryTypes.SELECT, replacements: { ids: partIds } },
  )
  const q = new Map(rows.map((r) => [`${r.partId}|${r.branchId}`, r.quantity]))
  for (const id of partIds) out.set(id, branches.map((b) => ({ branchCode: b.code, branchName: b.name, quantity: q.get(`${id}|${b.id}`) ?? 0 })))
  return out
}

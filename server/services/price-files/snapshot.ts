/**
 * The snapshot a check compares the file with: the parts with their prices in use and stock per branch, held
 * compactly (typed arrays indexed through one SKU table, {@link SkuSlots}: ~62 MB at a million parts, ~41 MB of it
 * the per-part columns, against ~110 MB with a `Map` of the SKUs). It is built when someone comes to the price files,
 * kept between checks and built again in the background when the catalogue, the prices or the version in use
 * move (revision counters bumped by triggers, whoever writes); stock moves with every order, so its counts are read
 * again whenever the stock revision moved.
 */
import { setImmediate as yieldToLoop } from 'node:timers/promises'
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import { jsonArray, jsonArrayAgg } from '../../utils/sql'
import { Branch } from '../../models/accounts'
import { activePriceVersionId } from '../price-versions'
import type { CurrentPart } from './rows'
import { SkuSlots } from './sku-slots'

/**
 * Parts and prices are loaded in slices of 5,000 parts, each slice one JSON text built by the database
 * (`json_group_array`, PostgreSQL's `json_agg`: server/utils/sql.ts) and parsed at once (much cheaper than 5,000
 * driver row objects), the next slice's query running while this one is unpacked.
 */
export class CatalogueSnapshot {
  private readonly skus = new SkuSlots()
  private ids: Int32Array
  private money: Float64Array // list, trade, core per part; NaN = none
  private packs: Int32Array // 0 = none
  private flags: Uint8Array // 1 = discontinued
  private setBy: Int32Array // the version that set the price in use (0 = none)
  private stock = new Int32Array(0) // per part, one count per branch of `branchCodes` (-1 = no row)
  private branchCodes: string[] = []
  /** first file row that named each part (0 = not yet) */
  firstRow: Int32Array
  /** the stock revision and branches the counts were read at (null = not read) */
  stockKey: string | null = null
  size = 0

  /** `capacity`: the parts expected (the columns grow past it if more come, so a count read first saves the copies) */
  constructor(capacity = 1024) {
    const n = Math.max(1024, capacity)
    this.ids = new Int32Array(n); this.money = new Float64Array(3 * n); this.packs = new Int32Array(n)
    this.flags = new Uint8Array(n); this.setBy = new Int32Array(n); this.firstRow = new Int32Array(n)
  }

  add(sku: string, id: number, status: string, l: number | null, t: number | null, c: number | null, k: number | null, by: number | null): void {
    if (this.size === this.ids.length) this.grow()
    const i = this.size++
    this.skus.add(sku)
    this.ids[i] = id
    this.money[3 * i] = l ?? NaN
    this.money[3 * i + 1] = t ?? NaN
    this.money[3 * i + 2] = c ?? NaN
    this.packs[i] = k ?? 0
    this.flags[i] = status === 'discontinued' ? 1 : 0
    this.setBy[i] = by ?? 0
  }

  private grow(): void {
    const n = this.ids.length * 2
    const g = <T extends Int32Array | Float64Array | Uint8Array>(a: T, len: number): T => { const b = new (a.constructor as new (n: number) => T)(len); b.set(a); return b }
    this.ids = g(this.ids, n); this.money = g(this.money, 3 * n); this.packs = g(this.packs, n)
    this.flags = g(this.flags, n); this.firstRow = g(this.firstRow, n); this.setBy = g(this.setBy, n)
  }

  /** the branch codes the stock counts were read for, in the order of their ids */
  get branchOrder(): readonly string[] { return this.branchCodes }
  slot(sku: string): number | undefined { return this.skus.get(sku) }
  id(i: number): number { return this.ids[i]! }
  sku(i: number): string { return this.skus.sku(i) }
  discontinued(i: number): boolean { return this.flags[i] === 1 }
  /** the version that set the part's price in use (null: no price) */
  pricedBy(i: number): number | null { return this.setBy[i] || null }

  /** The slot of a part id (ids are loaded in ascending order). */
  private slotOfId(id: number): number {
    let lo = 0, hi = this.size - 1
    while (lo <= hi) {
      const mid = (lo + hi) >> 1
      const v = this.ids[mid]!
      if (v === id) return mid
      if (v < id) lo = mid + 1; else hi = mid - 1
    }
    return -1
  }

  /** The counts of `stock` that differ from what the part holds now (null when none moves). */
  movedStock(i: number, stock: Record<string, number> | null): Record<string, number> | null {
    if (!stock) return null
    let moved: Record<string, number> | null = null
    const w = this.branchCodes.length
    for (const code in stock) {
      const b = this.branchCodes.indexOf(code)
      if (b < 0 || this.stock[i * w + b] !== stock[code]) (moved ??= {})[code] = stock[code]!
    }
    return moved
  }

  part(i: number): CurrentPart {
    const v = (x: number) => (Number.isNaN(x) ? null : x)
    return {
      id: this.ids[i]!, status: this.flags[i] ? 'discontinued' : 'active',
      list: v(this.money[3 * i]!), trade: v(this.money[3 * i + 1]!), core: v(this.money[3 * i + 2]!), pack: this.packs[i] || null,
    }
  }

  /** Parts and their prices in use. */
  static async load(): Promise<CatalogueSnapshot> {
    const [{ n }] = await getDb().query<{ n: number }>('SELECT COUNT(*) AS n FROM parts', { type: QueryTypes.SELECT }) as [{ n: number }]
    const snap = new CatalogueSnapshot(Number(n) + 1024)
    await inSlices(
      `SELECT ${jsonArrayAgg(jsonArray('p.id', 'p.sku', 'p.status', 'pr.list_price_minor', 'pr.trade_cost_minor', 'pr.core_deposit_minor', 'pr.pack_quantity', 'pr.price_version_id'), 'p.id')} AS rows
         FROM parts p LEFT JOIN part_prices pr ON pr.part_id = p.id WHERE p.id > $1 AND p.id <= $2`,
      (rows) => {
        for (const r of rows as [number, string, string, number | null, number | null, number | null, number | null, number | null][]) {
          snap.add(r[1], r[0], r[2], r[3], r[4], r[5], r[6], r[7])
        }
      },
    )
    snap.skus.trim()
    return snap
  }

  /** Stock per branch as it is now, for this check. */
  async loadStock(branches: { id: number; code: string }[]): Promise<void> {
    this.branchCodes = branches.map((b) => b.code)
    const w = branches.length
    const column = new Map(branches.map((b, i) => [b.id, i]))
    this.stock = new Int32Array(this.size * w).fill(-1)
    await inSlices(
      `SELECT ${jsonArrayAgg(jsonArray('part_id', 'branch_id', 'quantity'))} AS rows FROM stock_levels WHERE part_id > $1 AND part_id <= $2`,
      (rows) => {
        for (const [partId, branchId, quantity] of rows as [number, number, number][]) {
          const i = this.slotOfId(partId)
          const b = column.get(branchId)
          if (i >= 0 && b !== undefined) this.stock[i * w + b] = quantity
        }
      },
    )
  }
}

const SLICE = 5_000

/** Runs a `json_group_array` query over part id ranges of 5,000, the next range's query running while one is unpacked. */
async function inSlices(sql: string, take: (rows: unknown[]) => void): Promise<void> {
  const [{ top }] = await getDb().query<{ top: number | null }>('SELECT MAX(id) AS top FROM parts', { type: QueryTypes.SELECT }) as [{ top: number | null }]
  const slice = (from: number) => getDb().query<{ rows: string | null }>(sql, { bind: [from, from + SLICE], type: QueryTypes.SELECT, raw: true })
  let next = top ? slice(0) : null
  for (let from = 0; next; from += SLICE) {
    const [got] = await next
    next = from + SLICE < top! ? slice(from + SLICE) : null
    take(JSON.parse(got?.rows ?? '[]') as unknown[])
    await yieldToLoop()
  }
}

let kept: { key: string; snap: CatalogueSnapshot } | null = null
let warming: Promise<void> | null = null
let warmAgain = false

/** What the kept snapshot depends on: the catalogue and price revisions (triggers) and the version in use. */
async function snapshotKey(): Promise<string> {
  const [r] = await getDb().query<{ c: number; p: number }>('SELECT catalogue AS c, prices AS p FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT })
  return `${r?.c}:${r?.p}:${await activePriceVersionId()}`
}

/** The stock revision (triggers on stock_levels) and the branches: what the snapshot's counts depend on. */
async function stockKeyNow(): Promise<{ key: string; branches: { id: number; code: string }[] }> {
  const branches = (await Branch.findAll({ attributes: ['id', 'code'], order: [['id', 'ASC']] })).map((b) => ({ id: b.id, code: b.code }))
  const [r] = await getDb().query<{ s: number }>('SELECT stock AS s FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT })
  return { key: `${r?.s}:${branches.map((b) => `${b.id}=${b.code}`).join(',')}`, branches }
}

/** Reads the stock counts again if they moved since the snapshot last read them (an order, a credit, an apply). */
async function freshStock(snap: CatalogueSnapshot): Promise<void> {
  const { key, branches } = await stockKeyNow() // read before the load: a change during it leaves the key stale, never the data
  if (snap.stockKey === key) return
  snap.stockKey = null
  await snap.loadStock(branches)
  snap.stockKey = key
}

/**
 * Builds the kept snapshot in the background if the catalogue, prices or stock moved since it was built, or none is
 * kept. `BORELINE_PRICE_SNAPSHOT=0` keeps none (each check then loads its own).
 */
export function warmSnapshot(): Promise<void> {
  if (process.env.BORELINE_PRICE_SNAPSHOT === '0') return Promise.resolve()
  // asked again while building (a roll back right after an apply): build once more when this one ends, or the
  // next check would find the kept snapshot stale and wait for its own
  if (warming) { warmAgain = true; return warming }
  warming = (async () => {
    do {
      warmAgain = false
      const key = await snapshotKey() // read before the load: a change during it leaves the key stale, never the data
      if (kept?.key !== key) kept = { key, snap: await CatalogueSnapshot.load() }
      await freshStock(kept.snap)
    } while (warmAgain)
  })().catch((err) => console.error('[boreline] price snapshot:', err?.message ?? err)).finally(() => { warming = null })
  return warming
}

/**
 * Starts building the snapshot when none is kept nor being built: someone came to the price files (their list, an
 * upload), so the first check finds it ready, while a process nobody checks price files on never holds it (~62 MB at
 * a million parts, and ~100 MB more of heap while it loads; `BORELINE_PRICE_SNAPSHOT_AT_START=1` builds it at start).
 */
export function warmSnapshotIfCold(): void {
  if (!kept && !warming) void warmSnapshot()
}

/** After an apply, a roll back or a scheduled version taking effect: builds the kept snapshot again, if there is one. */
export function refreshSnapshot(): void {
  if (kept || warming) void warmSnapshot()
}

/** The snapshot for a check: the kept one when nothing moved since it was built, stock read again if it moved. */
export async function snapshotForCheck(): Promise<CatalogueSnapshot> {
  if (warming) await warming
  const key = await snapshotKey()
  let snap = kept?.key === key ? kept.snap : null
  if (!snap) {
    snap = await CatalogueSnapshot.load()
    if (process.env.BORELINE_PRICE_SNAPSHOT !== '0') kept = { key, snap }
  }
  snap.firstRow.fill(0)
  await freshStock(snap)
  return snap
}


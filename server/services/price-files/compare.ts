/**
 * Comparing a price file's rows with the snapshot of the prices in use, batch by batch in file order: each valid
 * row becomes a finding (new, changed, unchanged), refused rows and repeated SKUs become refusals, and at the end
 * the parts the file does not mention become "missing". Findings are kept as JSON chunks while they grow
 * (findings.ts), beside the compact lists the apply writes from: `prices` (new and replaced values of changed parts),
 * `stock` (counts that move) and `revive` (discontinued parts the file prices again).
 */
import { setImmediate as yieldToLoop } from 'node:timers/promises'
import type { ColumnMapping } from '../../../shared/types/price-files'
import { BatchReader, FIXED_NUMS, type RowBatch } from './row-batches'
import { classify } from './rows'
import type { CatalogueSnapshot } from './snapshot'
import { ChunkedList, F, NEW_STOCK, expandFinding, serialise, storedFinding, type PriceCheckFinding } from './findings'

const CHECK_KINDS = ['new', 'changed', 'unchanged', 'missing', 'rejected'] as const
type CheckKind = typeof CHECK_KINDS[number]
const KIND_CODE: Record<CheckKind, number> = { new: 0, changed: 1, unchanged: 2, missing: 3, rejected: 4 }

/** A refusal: the row, the SKU and part it names, the columns at fault and why (`raw`: the row's cells, if known). */
export function refusedFinding(row: number, sku: string | null, partId: number | null, columns: string | null, reason: string, raw: Record<string, string> | null): PriceCheckFinding {
  return [row, sku, partId, null, null, null, null, null, null, null, null, null, null, null, 0, null, (columns ?? '').slice(0, 300), reason, raw]
}

export interface CheckCounts { new: number; changed: number; unchanged: number; missing: number; rejected: number; large: number }

/** What a finished comparison writes: the counts, and each list of findings as JSON chunks under its kind. */
export interface ComparisonResult {
  counts: CheckCounts
  lists: [kind: string, chunks: { size: number; json: string }[]][]
}

export class Comparison {
  /** findings per kind, in file order; a repeated SKU's first row is moved to the refusals at the end */
  private readonly found = { new: new ChunkedList<unknown[]>(), changed: new ChunkedList<unknown[]>(), unchanged: new ChunkedList<unknown[]>(), missing: new ChunkedList<unknown>() }
  /** refusals as tuples: they are sorted by row at the end */
  private readonly rejected: PriceCheckFinding[] = []
  /** for the apply, beside `found.changed` (same indexes) */
  private readonly prices = new ChunkedList<unknown[]>()
  private large = 0
  // where each SKU's first valid row went: catalogue parts by snapshot slot, new SKUs by name
  private kindOfSlot = new Uint8Array(0)
  private indexOfSlot = new Int32Array(0)
  /** named by any row, refused ones too (so not "missing") */
  private mentioned = new Uint8Array(0)
  /** new SKUs: where each one's finding is in `found.new` (its row in `newRows`; no object per SKU to collect) */
  private readonly firstOfNew = new Map<string, number>()
  private newRows = new Int32Array(1024)
  private readonly repeats = new Map<string, number[]>()
  /** for the apply: stock counts that move ([partId, counts]) and discontinued parts the file prices again */
  private readonly stockMoves: unknown[] = []
  private readonly revive: number[] = []
  /** parts whose findings were withdrawn as repeats: their stock and revival are not applied */
  private readonly removedIds = new Set<number>()
  /**
   * for the apply: each new finding's stock counts, one per code of `newStockCodes` (the branches in the order the
   * snapshot holds them), in `found.new` order (-1 = none); positions withdrawn as repeats in `removedNew`
   */
  private newStock = new Int32Array(0)
  private newStockCodes: string[] | null = null
  /** where each of `newStockCodes` is in a batch's numbers */
  private newStockFrom: number[] = []
  private readonly removedNew: number[] = []

  constructor(private readonly mapping: ColumnMapping) {}

  /** Compares one batch of rows (in file order) with the snapshot. */
  compare(batch: RowBatch, snap: CatalogueSnapshot): void {
    if (this.kindOfSlot.length !== snap.size) {
      this.kindOfSlot = new Uint8Array(snap.size); this.indexOfSlot = new Int32Array(snap.size); this.mentioned = new Uint8Array(snap.size)
    }
    const rd = new BatchReader(batch)
    for (let i = 0; i < batch.n; i++) {
      const rowNumber = rd.row(i)
      if (!rd.ok(i)) {
        const r = rd.refused(i)
        const slot = r.sku ? snap.slot(r.sku) : undefined
        if (slot !== undefined) this.mentioned[slot] = 1
        this.rejected.push(refusedFinding(rowNumber, r.sku, slot === undefined ? null : snap.id(slot),
          [...new Set(r.issues.map((x) => x.column))].join(', '), r.issues.map((x) => x.reason).join(' '), r.raw))
        continue
      }
      const v = rd.values(i)
      const slot = snap.slot(v.sku)
      const newAt = slot === undefined ? this.firstOfNew.get(v.sku) : undefined
      const earlier = slot === undefined ? (newAt === undefined ? undefined : this.newRows[newAt]) : (snap.firstRow[slot] || undefined)
      if (earlier !== undefined) {
        this.repeats.set(v.sku, [...(this.repeats.get(v.sku) ?? [earlier]), rowNumber])
        this.rejected.push(refusedFinding(rowNumber, v.sku, slot === undefined ? null : snap.id(slot), this.mapping.sku,
          `SKU ${v.sku} appears more than once in the file (first on row ${earlier}): keep one row per SKU.`, null))
        continue
      }
      const cur = slot === undefined ? undefined : snap.part(slot)
      const c = classify(v, cur, this.mapping)
      if (c.kind === 'rejected') {
        if (slot !== undefined) this.mentioned[slot] = 1
        this.rejected.push([rowNumber, v.sku, cur?.id ?? null, cur ? null : v.type ?? null, cur ? null : v.description ?? null,
          cur?.list ?? null, c.list, cur?.trade ?? null, c.trade, cur ? cur.core ?? 0 : null, c.core, cur?.pack ?? null, c.pack,
          null, 0, v.stock ?? null, c.issue?.column ?? null, c.issue?.reason ?? null, null])
        continue
      }
      const list = this.found[c.kind]
      if (slot === undefined) {
        this.firstOfNew.set(v.sku, list.length)
        if (list.length >= this.newRows.length) { const g = new Int32Array(2 * this.newRows.length); g.set(this.newRows); this.newRows = g }
        this.newRows[list.length] = rowNumber
        if (c.kind === 'new') this.noteNewStock(list.length, batch, i, snap)
      } else {
        snap.firstRow[slot] = rowNumber
        this.mentioned[slot] = 1
        this.kindOfSlot[slot] = KIND_CODE[c.kind]
        this.indexOfSlot[slot] = list.length
        const moved = snap.movedStock(slot, v.stock ?? null)
        if (moved) this.stockMoves.push([cur!.id, moved])
        if (cur!.status === 'discontinued') this.revive.push(cur!.id)
      }
      const note = cur && cur.status === 'discontinued' ? 'Discontinued now: back in use when this file is applied.' : null
      list.push(storedFinding(c.kind, [
        rowNumber, v.sku, cur?.id ?? null, cur ? null : v.type ?? null, cur ? null : v.description ?? null,
        cur?.list ?? null, c.list, cur?.trade ?? null, c.trade, cur ? cur.core ?? 0 : null, c.core, cur?.pack ?? null, c.pack,
        c.changePct, c.large ? 1 : 0, v.stock ?? null, null, note, null,
      ]))
      if (c.kind === 'changed') {
        // with the values they replace: the apply checks that the version compared with is still in use, and only
        // price files change prices, so these are exactly what a roll back must write back
        this.prices.push([cur!.id, c.list, c.trade, c.core, c.pack, cur!.list, cur!.trade, cur!.core, cur!.pack, snap.pricedBy(slot!)])
        if (c.large) this.large++
      }
    }
  }

  /** Keeps the counts of valid row `i` of `batch`, the new finding at `index`. */
  private noteNewStock(index: number, batch: RowBatch, i: number, snap: CatalogueSnapshot): void {
    if (!this.newStockCodes) {
      const order = snap.branchOrder
      const rank = (code: string) => { const r = order.indexOf(code); return r < 0 ? order.length : r }
      this.newStockCodes = [...batch.stockCodes].sort((a, b) => rank(a) - rank(b))
      this.newStockFrom = this.newStockCodes.map((code) => FIXED_NUMS + batch.stockCodes.indexOf(code))
    }
    const w = this.newStockCodes.length
    if ((index + 1) * w > this.newStock.length) {
      const grown = new Int32Array(Math.max(1024, 2 * this.newStock.length, (index + 1) * w)).fill(-1)
      grown.set(this.newStock)
      this.newStock = grown
    }
    const o = i * batch.width
    for (let k = 0; k < w; k++) {
      const q = batch.nums[o + this.newStockFrom[k]!]!
      this.newStock[index * w + k] = Number.isNaN(q) ? -1 : q
    }
  }

  /**
   * The `newstock` list (versions.ts): one chunk per chunk of new findings, same size, `{ codes, counts }` with
   * the counts of each finding in turn (null: none).
   */
  private newStockChunks(sizes: number[]): { size: number; json: string }[] {
    const codes = this.newStockCodes ?? []
    const w = codes.length
    const head = `{"codes":${JSON.stringify(codes)},"counts":[`
    const removed = new Set(this.removedNew)
    const out: { size: number; json: string }[] = []
    let at = 0
    for (const size of sizes) {
      const parts: string[] = []
      for (let taken = 0; taken < size && at * w <= this.newStock.length; at++) {
        if (removed.has(at)) continue
        for (let k = 0; k < w; k++) { const q = this.newStock[at * w + k]!; parts.push(q < 0 ? 'null' : String(q)) }
        taken++
      }
      out.push({ size, json: `${head}${parts.join(',')}]}` })
    }
    return out
  }

  /**
   * After the last batch: the first row of a repeated SKU is refused too (which of the rows is right is the
   * person's call), the active parts the file does not mention become "missing", and refusals go in row order.
   */
  async settle(snap: CatalogueSnapshot): Promise<void> {
    this.withdrawRepeats(snap)
    if (this.mentioned.length !== snap.size) this.mentioned = new Uint8Array(snap.size)
    for (let i = 0; i < snap.size; i++) {
      if (this.mentioned[i] || snap.discontinued(i)) continue
      this.found.missing.push(snap.id(i)) // its id alone: the rest is the catalogue's (see storedFinding)
      if ((i & 16383) === 0) await yieldToLoop()
    }
    this.rejected.sort((a, b) => a[F.row]! - b[F.row]!)
  }

  private withdrawRepeats(snap: CatalogueSnapshot): void {
    const removed: Record<'new' | 'changed' | 'unchanged', number[]> = { new: [], changed: [], unchanged: [] }
    for (const [sku, rowsOf] of this.repeats) {
      const slot = snap.slot(sku)
      let kind: CheckKind | undefined
      let index = -1
      if (slot === undefined) {
        const first = this.firstOfNew.get(sku)
        if (first !== undefined) { kind = 'new'; index = first }
      } else {
        kind = CHECK_KINDS[this.kindOfSlot[slot]!]
        index = this.indexOfSlot[slot]!
      }
      if (kind !== 'new' && kind !== 'changed' && kind !== 'unchanged') continue
      const stored = this.found[kind].get(index)
      if (!stored) continue
      const first = expandFinding(kind, stored)
      removed[kind].push(index)
      if (kind === 'new') this.removedNew.push(index)
      if (first[F.partId] != null) this.removedIds.add(first[F.partId]!)
      if (kind === 'changed' && first[F.large]) this.large--
      this.rejected.push(refusedFinding(first[F.row]!, sku, first[F.partId], this.mapping.sku,
        `SKU ${sku} appears more than once in the file (rows ${rowsOf.join(', ')}): keep one row per SKU.`, null))
    }
    for (const k of ['new', 'changed', 'unchanged'] as const) if (removed[k].length) this.found[k].remove(removed[k])
    if (removed.changed.length) this.prices.remove(removed.changed)
  }

  /**
   * Refusals found while comparing (a repeated SKU, a new part without type or description) carry no cells: the
   * reading thread does not keep them. The caller fills `raw` in, reading those few rows again.
   */
  refusalsWithoutCells(): PriceCheckFinding[] {
    return this.rejected.filter((f) => f[F.raw] === null)
  }

  /** The counts and every list as JSON chunks (call once, after `settle`). */
  async result(): Promise<ComparisonResult> {
    const { found, rejected, prices, removedIds } = this
    for (const list of [...Object.values(found), prices]) list.flush()
    const counts = {
      new: found.new.length, changed: found.changed.length, unchanged: found.unchanged.length,
      missing: found.missing.length, rejected: rejected.length, large: this.large,
    }
    const lists: ComparisonResult['lists'] = [
      ['new', found.new.chunks], ['changed', found.changed.chunks], ['unchanged', found.unchanged.chunks],
      ['missing', found.missing.chunks], ['rejected', await serialise(rejected)],
      ['prices', prices.chunks],
      ['stock', await serialise(removedIds.size ? this.stockMoves.filter((x) => !removedIds.has((x as [number])[0])) : this.stockMoves)],
      ['revive', await serialise(removedIds.size ? this.revive.filter((x) => !removedIds.has(x)) : this.revive)],
      [NEW_STOCK, this.newStockChunks(found.new.chunks.map((c) => c.size))],
    ]
    return { counts, lists }
  }
}

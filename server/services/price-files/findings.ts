/**
 * What a price file's check found, stored as a few JSON chunks per kind in `price_file_findings` instead of one
 * table row per file row: writing 200,000 findings is then a handful of statements (measured on this machine:
 * 1.9 s to stage 200,000 table rows, about 0.2 s for the same findings as chunks, commit included), and the apply
 * reads them back inside SQLite (`json_each`) with set-based statements.
 *
 * One finding is a positional tuple (see `PriceCheckFinding`); the same positions are used by the apply's SQL (`col()`).
 * Besides the check's kinds (new, changed, unchanged, missing, rejected) the check writes compact lists for the
 * apply: `prices` (`[partId, list, trade, core, pack, old list, old trade, old core, old pack, old version]` for each
 * changed part: what the apply writes and what a roll back writes back), `stock` (`[partId, { branch: count }]`, only
 * counts that differ from the catalogue's) and `revive` (ids of discontinued parts the file prices). The apply records
 * the part statuses it changed, for the roll back: `created`, `discontinued`, `reactivated` (part ids).
 *
 * Reading for the preview loads one kind of one price file into memory (a few MB even for 200,000 rows) and keeps
 * the last few in a small cache; chunk ids only grow, so a new check of the same price file is never served stale.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { getDb } from '../../utils/db'
import { jsonAt, jsonElementsForReading, jsonValue, joinedInOrder } from '../../utils/sql'
import type { ChangeKind } from '../../../shared/types/price-files'

export type PriceCheckFinding = [
  row: number | null, sku: string | null, partId: number | null, type: string | null, description: string | null,
  oldList: number | null, newList: number | null, oldTrade: number | null, newTrade: number | null,
  oldCore: number | null, newCore: number | null, oldPack: number | null, newPack: number | null,
  pct: number | null, large: 0 | 1, stock: Record<string, number> | null, columns: string | null, reason: string | null,
  raw: Record<string, string> | null,
]

/** Positions in a finding tuple. */
export const F = {
  row: 0, sku: 1, partId: 2, type: 3, description: 4, oldList: 5, newList: 6, oldTrade: 7, newTrade: 8,
  oldCore: 9, newCore: 10, oldPack: 11, newPack: 12, pct: 13, large: 14, stock: 15, columns: 16, reason: 17, raw: 18,
} as const

/**
 * Findings are stored short: trailing nulls are left off (reading `v->>18` of a shorter array gives NULL in SQL,
 * and `expandFinding` pads it again), and an unchanged part, whose old and new values are the same, is
 * `[row, sku, partId, list, trade, core, oldPack, newPack, stock, note]`. A 200,000-row file's findings are then
 * about half the text to write and to parse. A missing part is stored as its part id alone (a number, written by
 * compare.ts): its SKU and the values in use are the catalogue's, read back when the findings are (`readFindings`),
 * and they are what the check compared with for as long as the file can be applied (an apply is refused once the
 * prices in use have changed). A file that leaves out 200,000 parts then writes 1.4 MB for them instead of 8.7 MB.
 * Checks made before that wrote `[null, sku, partId, list, trade, core, pack]` (the part id where the full tuple has
 * it; a full missing finding is never shorter than 15), and the apply's SQL reads every form (`missingPartId`). A
 * new part is
 * `[row, sku, type, description, list, trade, core, pack, stock]` (`NEW_SHORT`; a full one is never shorter than 15,
 * so the apply tells the forms apart by the first one's length, `newCol`).
 */
export function storedFinding(kind: string, f: PriceCheckFinding): unknown[] {
  if (kind === 'new' && f[F.partId] === null && f[F.pct] === null && !f[F.large] && f[F.reason] === null && f[F.columns] === null && f[F.raw] === null) {
    const short = [f[F.row], f[F.sku], f[F.type], f[F.description], f[F.newList], f[F.newTrade], f[F.newCore], f[F.newPack], f[F.stock]]
    while (short.length > 5 && short[short.length - 1] === null) short.pop()
    return short
  }
  if (kind === 'unchanged') {
    const short = [f[F.row], f[F.sku], f[F.partId], f[F.newList], f[F.newTrade], f[F.newCore], f[F.oldPack], f[F.newPack], f[F.stock], f[F.reason]]
    while (short.length && short[short.length - 1] === null) short.pop()
    return short
  }
  const out: unknown[] = f
  let n = out.length
  while (n && out[n - 1] === null) n--
  return n === out.length ? out : out.slice(0, n)
}

/** A stored finding as the full tuple (see `storedFinding`; findings written before it are full already). */
export function expandFinding(kind: string, v: unknown[]): PriceCheckFinding {
  const at = (i: number) => (v[i] ?? null) as never
  if (kind === 'unchanged' && v.length <= 10) {
    return [at(0), at(1), at(2), null, null, at(3), at(3), at(4), at(4), at(5), at(5), at(6), at(7), at(3) ? 0 : null, 0, at(8), null, at(9), null]
  }
  if (kind === 'new' && v.length <= NEW_SHORT.stock + 1) {
    return [at(0), at(1), null, at(2), at(3), null, at(4), null, at(5), null, at(6), null, at(7), null, 0, at(8), null, null, null]
  }
  if (kind === 'missing' && v.length <= 7) {
    return [null, at(1), at(2), null, null, at(3), null, at(4), null, at(5), null, at(6), null, null, 0, null, null, null, null]
  }
  const f = v as PriceCheckFinding
  while (f.length < 19) (f as unknown[]).push(null)
  return f
}

/** SQL for the part id of a missing finding held in `alias.v`, in any form it was stored in (see `storedFinding`). */
export function missingPartId(alias = 'f'): string {
  // a tuple has the id at F.partId; a bare id is not an array, so reading a position of it gives NULL (both databases)
  return `COALESCE(${col('partId', alias)}, ${jsonValue(`${alias}.v`)})`
}

/** Positions in the short form of a new finding (see `storedFinding`). */
export const NEW_SHORT = { row: 0, sku: 1, type: 2, description: 3, newList: 4, newTrade: 5, newCore: 6, newPack: 7, stock: 8 } as const

/**
 * SQL for one position of a new finding held in `alias.v`, in the form the check stored (`short`: see
 * `storedFinding`; findings of a check made before it are full tuples).
 */
export function newCol(name: keyof typeof NEW_SHORT, short: boolean, alias = 'f'): string {
  return jsonAt(`${alias}.v`, short ? NEW_SHORT[name] : F[name], TEXT_FIELDS.has(name) ? 'text' : 'int')
}

/** SQL for one position of a finding held in `alias.v` (a row of `findingsOf`). */
export function col(name: keyof typeof F, alias = 'f'): string {
  return jsonAt(`${alias}.v`, F[name], TEXT_FIELDS.has(name) ? 'text' : name === 'pct' ? 'real' : 'int')
}
const TEXT_FIELDS = new Set<keyof typeof F>(['sku', 'type', 'description', 'stock', 'columns', 'reason', 'raw'])

/**
 * A subquery of the findings of the given kinds of the price file bound as `$1`, one row per finding (column `v`,
 * the tuple as JSON, binary on SQLite where it can be: read it only through `col`, `jsonAt` and `jsonPart`):
 * `FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')}`.
 */
export function findingsOf(kinds: string[]): string {
  const list = kinds.map((k) => `'${k.replace(/[^a-z_]/g, '')}'`).join(', ')
  return `(SELECT j.value AS v FROM price_file_findings c, ${jsonElementsForReading('c.rows', 'j')} WHERE c.price_file_id = $1 AND c.kind IN (${list}))`
}

/**
 * The new parts' stock counts, written by the check beside the new findings for the apply (compare.ts,
 * versions.ts): one chunk per chunk of new findings, `{ codes, counts }`, each finding's counts in turn.
 */
export const NEW_STOCK = 'newstock'

const CHUNK = 5_000

/** Writes findings of one kind (already serialised chunk by chunk, see `serialise`). */
export async function writeChunks(t: Transaction, priceFileId: number, kind: string, chunks: { size: number; json: string }[]): Promise<void> {
  let seq = 0
  for (const c of chunks) {
    await getDb().query('INSERT INTO price_file_findings (price_file_id, kind, seq, size, rows) VALUES ($1, $2, $3, $4, $5)', {
      bind: [priceFileId, kind, seq++, c.size, c.json], transaction: t, type: QueryTypes.INSERT,
    })
  }
}

/**
 * A list of findings kept as JSON chunks while it grows: a 200,000-row check then holds a few MB of text instead
 * of 200,000 small arrays for the garbage collector to trace, and each chunk is a short piece of synchronous work.
 */
export class ChunkedList<T> {
  private pending: T[] = []
  /** JSON of the current chunk's earlier items, a few hundred at a time (without the brackets) */
  private pieces: string[] = []
  private inChunk = 0
  readonly chunks: { size: number; json: string }[] = []
  length = 0
  constructor(private readonly chunkSize = 5000, private readonly pieceSize = 500) {}

  /** Adds an item; returns its index. */
  push(item: T): number {
    this.pending.push(item)
    // items become text a few hundred at a time, so they die young (the collector never promotes them)
    if (this.pending.length >= this.pieceSize) this.toText()
    if (this.inChunk + this.pending.length >= this.chunkSize) this.flush()
    return this.length++
  }

  private toText(): void {
    if (!this.pending.length) return
    this.pieces.push(JSON.stringify(this.pending).slice(1, -1))
    this.inChunk += this.pending.length
    this.pending = []
  }

  flush(): void {
    this.toText()
    if (!this.inChunk) return
    this.chunks.push({ size: this.inChunk, json: `[${this.pieces.join(',')}]` })
    this.pieces = []
    this.inChunk = 0
  }

  /** The item at `index` (parses its chunk: for the rare repeated SKU only). */
  get(index: number): T | undefined {
    const k = Math.floor(index / this.chunkSize)
    if (k < this.chunks.length) return (JSON.parse(this.chunks[k]!.json) as T[])[index % this.chunkSize]
    this.toText()
    if (!this.inChunk) return undefined
    return (JSON.parse(`[${this.pieces.join(',')}]`) as T[])[index - this.chunks.length * this.chunkSize]
  }

  /** Drops the items at these indexes (call once, at the end). */
  remove(indexes: number[]): void {
    this.flush()
    const byChunk = new Map<number, Set<number>>()
    for (const i of indexes) {
      const k = Math.floor(i / this.chunkSize)
      byChunk.set(k, (byChunk.get(k) ?? new Set()).add(i % this.chunkSize))
    }
    for (const [k, drop] of byChunk) {
      const items = (JSON.parse(this.chunks[k]!.json) as T[]).filter((_, j) => !drop.has(j))
      this.chunks[k] = { size: items.length, json: JSON.stringify(items) }
      this.length -= drop.size
    }
  }
}

/** JSON text in chunks of 5,000 findings, giving the event loop back between chunks. */
export async function serialise(list: unknown[]): Promise<{ size: number; json: string }[]> {
  const out: { size: number; json: string }[] = []
  for (let i = 0; i < list.length; i += CHUNK) {
    const part = list.slice(i, i + CHUNK)
    out.push({ size: part.length, json: JSON.stringify(part) })
    await new Promise<void>((r) => setImmediate(r))
  }
  return out
}

export async function deleteFindings(t: Transaction, priceFileId: number, kinds?: string[]): Promise<void> {
  if (kinds) {
    await getDb().query(`DELETE FROM price_file_findings WHERE price_file_id = $1 AND kind IN (${kinds.map((_, i) => `$${i + 2}`).join(', ')})`, {
      bind: [priceFileId, ...kinds], transaction: t,
    })
  } else {
    await getDb().query('DELETE FROM price_file_findings WHERE price_file_id = $1', { bind: [priceFileId], transaction: t })
  }
}

// ------------------------------------------------------------------------------------------- reading

interface Cached { stamp: string; rows: PriceCheckFinding[] }
const cache = new Map<string, Cached>()
const CACHE_ENTRIES = 4

/** Every finding of one kind of one price file, in file order (missing parts: catalogue order). */
export async function readFindings(priceFileId: number, kind: ChangeKind, t?: Transaction): Promise<PriceCheckFinding[]> {
  const [stampRow] = await getDb().query<{ stamp: string | null }>(
    joinedInOrder('id', 'seq', 'price_file_findings WHERE price_file_id = $1 AND kind = $2', 'stamp'),
    { bind: [priceFileId, kind], type: QueryTypes.SELECT, transaction: t },
  )
  let stamp = stampRow?.stamp ?? ''
  if (kind === 'missing' && stamp) {
    // missing parts stored by id show the catalogue's SKU and prices as they are now (fillMissing)
    const [rev] = await getDb().query<{ c: number; p: number }>('SELECT catalogue AS c, prices AS p FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT, transaction: t })
    stamp += `@${rev?.c ?? 0}.${rev?.p ?? 0}`
  }
  const key = `${priceFileId}:${kind}`
  const hit = cache.get(key)
  if (hit && hit.stamp === stamp) {
    cache.delete(key); cache.set(key, hit) // most recently used last
    return hit.rows
  }
  const rows: PriceCheckFinding[] = []
  if (stamp) {
    const chunks = await getDb().query<{ rows: string }>(
      'SELECT rows FROM price_file_findings WHERE price_file_id = $1 AND kind = $2 ORDER BY seq',
      { bind: [priceFileId, kind], type: QueryTypes.SELECT, transaction: t },
    )
    const ids: number[] = []
    for (const c of chunks) {
      for (const f of JSON.parse(c.rows) as unknown[]) {
        if (Array.isArray(f)) rows.push(expandFinding(kind, f))
        else { ids.push(Number(f)); rows.push(null as unknown as PriceCheckFinding) } // a missing part's id: filled in below
      }
    }
    if (ids.length) await fillMissing(rows, ids, t)
  }
  cache.set(key, { stamp, rows })
  while (cache.size > CACHE_ENTRIES) cache.delete(cache.keys().next().value!)
  return rows
}

/**
 * Fills the places left for missing parts stored by id (in `rows`, in order) with their SKU and the values in use,
 * read from the catalogue 5,000 at a time.
 */
async function fillMissing(rows: PriceCheckFinding[], ids: number[], t?: Transaction): Promise<void> {
  const found = new Map<number, unknown[]>()
  for (let i = 0; i < ids.length; i += 5000) {
    const some = ids.slice(i, i + 5000)
    const parts = await getDb().query<{ id: number; sku: string; list: number | null; trade: number | null; core: number | null; pack: number | null }>(
      `SELECT p.id, p.sku, pr.list_price_minor AS list, pr.trade_cost_minor AS trade, pr.core_deposit_minor AS core, pr.pack_quantity AS pack
         FROM parts p LEFT JOIN part_prices pr ON pr.part_id = p.id WHERE p.id IN (:ids)`,
      { replacements: { ids: some }, type: QueryTypes.SELECT, transaction: t },
    )
    for (const p of parts) found.set(Number(p.id), [null, p.sku, Number(p.id), p.list, p.trade, p.core ?? 0, p.pack])
  }
  let k = 0
  for (let i = 0; i < rows.length; i++) {
    if (rows[i] !== null) continue
    const id = ids[k++]!
    rows[i] = expandFinding('missing', found.get(id) ?? [null, null, id])
  }
}

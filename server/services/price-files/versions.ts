/**
 * Writing the price version a checked file makes, inside the caller's write transaction (all rows or none).
 *
 * The prices in use live in `part_prices`, one row per part. A new version is the file's findings over the
 * version before it: the writes below put the file's values on the parts that are new or whose prices move (the
 * check's `prices` list, which also holds the values they replace) and record the part statuses they change, so a
 * roll back (rollback.ts) can write those replaced values back and undo the statuses. Bulk work is a handful of
 * set-based statements reading the findings inside the database (`findingsOf`: JSONB on SQLite), so even 200,000
 * rows hold the write lock briefly; on SQLite the per-row revision and part-search triggers are off for those
 * statements and what they would have written is written once (`withoutRowTriggers`, `BULK_TRIGGERS`).
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { foreignKeysChecked, getDb } from '../../utils/db'
import { jsonArrayAgg, jsonArrayLengthAt, jsonAt, jsonAtKey, jsonElements, jsonElementsForReading, jsonEntries, jsonPart, jsonValue, lastChanges, typed, withoutRowTriggers } from '../../utils/sql'
import { PriceVersion } from '../../models/catalogue'
import type { PriceFile } from '../../models/price-files'
import type { MissingAction } from '../../../shared/types/price-files'
import { activePriceVersionId } from '../price-versions'
import { MAX_PATCH } from '../catalogue/catalogue-index'
import { conflict } from '../errors'
import { F, NEW_SHORT, NEW_STOCK, deleteFindings, findingsOf, missingPartId, newCol } from './findings'

/** SQLite text for a date in the form Sequelize writes (so models read raw-SQL rows back alike). */
export function sqlDate(d: Date): string {
  return `${d.toISOString().replace('T', ' ').replace('Z', '')} +00:00`
}

/** The number people know a price version by (null: no such version). */
export async function versionNumberOf(id: number | null, t?: Transaction): Promise<number | null> {
  if (!id) return null
  return (await PriceVersion.findByPk(id, { transaction: t }))?.version ?? null
}

/** What the check found, for the audit trail. */
export function countsFor(priceFile: PriceFile) {
  return {
    new: priceFile.countNew, changed: priceFile.countChanged, unchanged: priceFile.countUnchanged,
    missing: priceFile.countMissing, rejected: priceFile.countRejected, large: priceFile.countLarge,
  }
}

/** The next version number, reserved as a `scheduled` row with no prices yet. */
export async function reserveVersion(t: Transaction, priceFile: PriceFile, userId: number, effectiveAt: Date | null): Promise<PriceVersion> {
  const [{ next }] = await getDb().query<{ next: number }>('SELECT COALESCE(MAX(version), 0) + 1 AS next FROM price_versions', { type: QueryTypes.SELECT, transaction: t }) as [{ next: number }]
  const when = (effectiveAt ?? new Date()).toISOString().slice(0, 10)
  return PriceVersion.create({
    version: next,
    label: `${priceFile.supplierName || priceFile.fileName} · ${when}`.slice(0, 160),
    status: 'scheduled',
    effectiveAt,
    activatedAt: null,
    createdByUserId: userId,
  }, { transaction: t })
}

/** Removes a reserved version that never took effect (it has no prices). */
export async function dropReservedVersion(t: Transaction, priceVersionId: number): Promise<void> {
  await getDb().query(`DELETE FROM price_versions WHERE id = $1 AND status = 'scheduled'`, { bind: [priceVersionId], transaction: t })
}

/**
 * Writes the version's prices and makes it active, inside the caller's transaction. `reserved` is the row from
 * `reserveVersion`. Returns the id of the version that was active before.
 */
export async function buildVersion(t: Transaction, priceFile: PriceFile, reserved: PriceVersion, opts: { missingParts: MissingAction; failMidway?: boolean }): Promise<number | null> {
  const q = (sql: string, bind: unknown[]) => getDb().query(sql, { bind, transaction: t })
  const now = sqlDate(new Date())
  const u = priceFile.id
  await deleteFindings(t, u, APPLY_RECORDS) // left by an earlier apply of this file that was rolled back or failed

  // the form the check stored its new findings in (the first one's length: see storedFinding)
  const [form] = await getDb().query<{ n: number | null }>(
    `SELECT ${jsonArrayLengthAt('rows', 0)} AS n FROM price_file_findings WHERE price_file_id = $1 AND kind = 'new' ORDER BY seq LIMIT 1`,
    { bind: [u], type: QueryTypes.SELECT, transaction: t },
  )
  const short = form?.n != null && Number(form.n) <= NEW_SHORT.stock + 1
  const nc = (name: keyof typeof NEW_SHORT) => newCol(name, short)
  // a part added by hand since the check would collide with a "new" row: refuse rather than guess
  const refuseClash = async (upToPart?: number): Promise<void> => {
    const made = upToPart === undefined ? '' : ` AND p.id <= ${Number(upToPart)}` // not this apply's own
    const [clash] = await getDb().query<{ sku: string }>(
      `SELECT p.sku FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${nc('sku')}${made} LIMIT 1`,
      { bind: [u], type: QueryTypes.SELECT, transaction: t },
    )
    if (clash) throw conflict(`A part with SKU ${clash.sku} was added to the catalogue after this file was checked. Check the file again before applying it.`)
  }

  const at = typed('$2', 'timestamptz')
  await withoutRowTriggers(t, BULK_TRIGGERS, async (rowTriggersOff, newestFirst) => {
    const one = async (sql: string, bind: unknown[]) => Number((await getDb().query<{ n: number }>(sql, { bind, type: QueryTypes.SELECT, transaction: t }))[0]?.n ?? 0)
    /** what a revision trigger adds for the rows the last statement wrote: one per row */
    const bump = async (column: 'catalogue' | 'prices' | 'stock', rows: number) => {
      if (rows > 0) await q(`UPDATE catalogue_revisions SET ${column} = ${column} + $1 WHERE id = 1`, [rows])
    }
    // SQLite: the revision before the new parts and the last part id so far (one writer: every part above it is this apply's)
    const revision = rowTriggersOff ? await one('SELECT catalogue AS n FROM catalogue_revisions WHERE id = 1', []) : 0
    const lastPart = rowTriggersOff ? await one('SELECT COALESCE(MAX(id), 0) AS n FROM parts', []) : 0
    // SQLite: each new part's id is worked out from its finding's place (`newPlaces`), so the statements after this
    // one reach the new parts without looking 200,000 SKUs up
    const places = rowTriggersOff ? await newPlaces(t, u, lastPart) : null
    // PostgreSQL: looked for first (a statement that fails there ends the transaction); SQLite: the insert skips a
    // clash and the count tells (one pass over the findings fewer)
    if (!rowTriggersOff) await refuseClash()
    if (!await foreignKeysChecked(t)) await proveReferences(t, u)
    if (places) {
      await q(`INSERT INTO parts (id, sku, type, product_line, description, specs, status, created_at, updated_at)
               SELECT f.id, ${nc('sku')}, ${nc('type')}, '', ${nc('description')}, '{}', 'active', ${at}, ${at} FROM ${places.findings} f
                WHERE true ON CONFLICT (sku) DO NOTHING`, [u, now])
    } else {
      await q(`INSERT INTO parts (sku, type, product_line, description, specs, status, created_at, updated_at)
               SELECT ${nc('sku')}, ${nc('type')}, '', ${nc('description')}, '{}', 'active', ${at}, ${at} FROM ${findingsOf(['new'])} f`, [u, now])
    }
    if (places) {
      const created = await lastChanges(t)
      if (created !== places.count) {
        await refuseClash(lastPart)
        throw new Error('fewer parts were made than the file has new rows')
      }
      // what parts_search_insert and parts_rev_insert write for each new part, in the order the parts were written:
      // the part noted at the revision as it stands when the search trigger runs (before that part's own bump when
      // it is the newer trigger, as the migrations made them; after it otherwise), and the revision one up per part.
      // One INSERT numbers its rows one after another, so the n-th new part is the first id + n.
      // Only the first MAX_PATCH + 1 are noted when there are more: the index reads this log from a revision it saw
      // committed, which is before this transaction (then MAX_PATCH + 1 parts changed since is already "build the
      // index again", catalogue-index.ts) or after it (then none of these count), never one in between.
      const noted = revision + (newestFirst.indexOf('parts_search_insert') < newestFirst.indexOf('parts_rev_insert') ? 0 : 1)
      if (created > 0) {
        const first = await one('SELECT MIN(id) AS n FROM parts WHERE id > $1', [lastPart])
        if (first !== places.first || await one('SELECT MAX(id) AS n FROM parts', []) !== first + created - 1) throw new Error('the new parts\' ids are not consecutive')
        await q(`INSERT INTO part_search_changes (part_id, revision)
                 SELECT id, id - $1 + $2 FROM parts WHERE id >= $1 AND id <= $3
                 ON CONFLICT (part_id) DO UPDATE SET revision = excluded.revision`, [first, noted, first + MAX_PATCH])
      }
      await bump('catalogue', created)
      await record(t, u, 'created', `SELECT id FROM parts WHERE id > ${Number(lastPart)}`)
    } else {
      await record(t, u, 'created', `SELECT p.id FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${nc('sku')}`)
    }

    // the file's prices, for the parts whose prices move ('prices': [partId, list, trade, core, pack]) and the new parts
    await q(`INSERT INTO part_prices (part_id, list_price_minor, trade_cost_minor, core_deposit_minor, pack_quantity, price_version_id)
             SELECT ${jsonAt('f.v', 0, 'int')}, ${jsonAt('f.v', 1, 'int')}, ${jsonAt('f.v', 2, 'int')}, COALESCE(${jsonAt('f.v', 3, 'int')}, 0),
                    COALESCE(${jsonAt('f.v', 4, 'int')}, 1), ${typed('$2', 'integer')} FROM ${findingsOf(['prices'])} f
             UNION ALL
             SELECT ${places ? 'f.id' : 'p.id'}, ${nc('newList')}, ${nc('newTrade')}, COALESCE(${nc('newCore')}, 0), COALESCE(${nc('newPack')}, 1), ${typed('$2', 'integer')}
               FROM ${places ? `${places.findings} f` : `${findingsOf(['new'])} f JOIN parts p ON p.sku = ${nc('sku')}`} WHERE true
             ON CONFLICT (part_id) DO UPDATE SET list_price_minor = excluded.list_price_minor, trade_cost_minor = excluded.trade_cost_minor,
               core_deposit_minor = excluded.core_deposit_minor, pack_quantity = excluded.pack_quantity, price_version_id = excluded.price_version_id`, [u, reserved.id])
    // part_prices_bump_insert / _update: one up per price row written
    if (rowTriggersOff) await bump('prices', await lastChanges(t))

    if (opts.missingParts === 'discontinue') {
      await record(t, u, 'discontinued', `SELECT p.id FROM ${findingsOf(['missing'])} f JOIN parts p ON p.id = ${missingPartId()} WHERE p.status = 'active'`)
      await q(`UPDATE parts SET status = 'discontinued', updated_at = $2 WHERE id IN (${recorded('discontinued')})`, [u, now])
    }
    // discontinued parts that the file prices again are back in use
    await record(t, u, 'reactivated', `SELECT p.id FROM ${findingsOf(['revive'])} f JOIN parts p ON p.id = ${jsonValue('f.v')} WHERE p.status = 'discontinued'`)
    await q(`UPDATE parts SET status = 'active', updated_at = $2 WHERE id IN (${recorded('reactivated')})`, [u, now])
    // stock per branch: the counts the check found moving ('stock': [partId, { branch: count }]) ...
    await q(`INSERT INTO stock_levels (part_id, branch_id, quantity, updated_at)
             SELECT x.id, b.id, CAST(s.value AS INTEGER), ${at}
               FROM (SELECT ${jsonAt('f.v', 0, 'int')} AS id, ${jsonPart('f.v', 1)} AS stock FROM ${findingsOf(['stock'])} f) x,
                    ${jsonEntries('x.stock', 's')} JOIN branches b ON b.code = s.key
              WHERE true
             ON CONFLICT (part_id, branch_id) DO UPDATE SET quantity = excluded.quantity, updated_at = excluded.updated_at
               WHERE stock_levels.quantity <> excluded.quantity`, [u, now])
    // stock_levels_rev_insert / _update: one up per stock row written (a count left as it was is not written)
    if (rowTriggersOff) await bump('stock', await lastChanges(t))
    // ... and the new parts' counts, one row per branch the file gives a count for (a part made above has none yet)
    const counts = places ? await newStockOf(t, u, places) : null
    if (counts) {
      await q(`INSERT INTO stock_levels (part_id, branch_id, quantity, updated_at)
               SELECT ${counts.partId}, ${counts.branchId}, s.value, ${at}
                 FROM price_file_findings c, json_each(c.rows, '$.counts') s
                WHERE c.price_file_id = $1 AND c.kind = '${NEW_STOCK}' AND s.value IS NOT NULL AND ${counts.known}`, [u, now])
    } else {
      const count = jsonAtKey('f.v', short ? NEW_SHORT.stock : F.stock, 'b.code')
      await q(`INSERT INTO stock_levels (part_id, branch_id, quantity, updated_at)
               SELECT p.id, b.id, CAST(${count} AS INTEGER), ${at}
                 FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${nc('sku')} CROSS JOIN branches b
                WHERE ${count} IS NOT NULL`, [u, now])
    }
    if (rowTriggersOff) await bump('stock', await lastChanges(t))

    // thrown with the triggers off: the rollback must bring them back with the data
    if (opts.failMidway) throw new Error('test hook: apply stopped midway')
  })

  const previous = await activePriceVersionId(t)
  await q(`UPDATE price_versions SET status = 'retired', updated_at = $1 WHERE status = 'active'`, [now])
  await q(`UPDATE price_versions SET status = 'active', activated_at = $2, updated_at = $2 WHERE id = $1`, [reserved.id, now])
  return previous
}

/**
 * SQLite, on a connection that checks no foreign keys (the apply asks for one: `referencesProvedByCaller` in
 * withWrite), every reference the apply writes is proved instead of looked up row by row:
 * - a new part's prices and counts name the id just given to it (`newPlaces`: the ids are checked to be the
 *   consecutive ones made, and as many as the file's new rows), or the part found by its SKU when the check is older;
 * - a branch is one of the `branches` rows, joined or read in this transaction; the price version is the one
 *   reserved for this file; the person is the one signed in (people and branches are never deleted);
 * - the parts whose prices or counts move are the check's, looked up here in one pass (parts are never deleted
 *   either, so this only guards against a database changed by hand).
 */
async function proveReferences(t: Transaction, priceFileId: number): Promise<void> {
  const [gone] = await getDb().query<{ id: number }>(
    `SELECT x.id FROM (SELECT ${jsonAt('f.v', 0, 'int')} AS id FROM ${findingsOf(['prices', 'stock'])} f) x LEFT JOIN parts p ON p.id = x.id WHERE p.id IS NULL LIMIT 1`,
    { bind: [priceFileId], type: QueryTypes.SELECT, transaction: t },
  )
  if (gone) throw conflict('A part this file changes is no longer in the catalogue. Check the file again before applying it.')
}

/** Where the new findings' places begin and end, for SQL over price_file_findings `c` (one row per chunk). */
interface NewPlaces {
  /** the id the first new part gets (the next id SQLite would give: above every id the table ever held) */
  first: number
  /** the new findings */
  count: number
  /** chunk seq -> the place of its first finding, as SQL of `c.seq` */
  offset: string
  /** the new findings with the id each part gets: `(SELECT id, v …)` */
  findings: string
  /** the chunks, [seq, size] in seq order */
  chunks: [number, number][]
}

/**
 * SQLite: the new parts are written with ids one after another in the order of their findings (chunk `seq`, then
 * place in the chunk), the ids SQLite would have given them one by one (AUTOINCREMENT: above the highest id the
 * table ever held). A new part's id is then its finding's place plus the first id, whatever order a statement
 * reads the findings in, and the prices and stock of the new parts need no lookup by SKU.
 */
async function newPlaces(t: Transaction, priceFileId: number, lastPart: number): Promise<NewPlaces> {
  const rows = await getDb().query<{ seq: number; size: number }>(
    `SELECT seq, size FROM price_file_findings WHERE price_file_id = $1 AND kind = 'new' ORDER BY seq`,
    { bind: [priceFileId], type: QueryTypes.SELECT, transaction: t },
  )
  const chunks = rows.map((r) => [Number(r.seq), Number(r.size)] as [number, number])
  const [sequence] = await getDb().query<{ n: number | null }>(
    `SELECT (SELECT seq FROM sqlite_sequence WHERE name = 'parts') AS n FROM sqlite_master WHERE name = 'sqlite_sequence'`,
    { type: QueryTypes.SELECT, transaction: t },
  )
  const first = Math.max(lastPart, Number(sequence?.n ?? 0)) + 1
  // every chunk but the last the same size and seq 0, 1, 2…: the offset is seq × size; otherwise chunk by chunk
  const size = chunks[0]?.[1] ?? 0
  const even = chunks.every(([seq, n], i) => seq === i && (n === size || i === chunks.length - 1))
  let at = 0
  const offset = even ? `(c.seq * ${size})` : `(CASE c.seq ${chunks.map(([seq, n]) => { const w = `WHEN ${seq} THEN ${at}`; at += n; return w }).join(' ')} END)`
  return {
    first, count: chunks.reduce((n, [, k]) => n + k, 0), offset, chunks,
    findings: `(SELECT ${first} + ${offset} + j.key AS id, j.value AS v FROM price_file_findings c, ${jsonElementsForReading('c.rows', 'j')}
                 WHERE c.price_file_id = $1 AND c.kind = 'new')`,
  }
}

/**
 * SQL for the new parts' counts (`newstock`: per chunk of new findings, `{ codes, counts }` with one count per
 * code for each finding in turn, null for none): the part id and branch id of count `s` of chunk `c`, and which
 * counts name a branch that exists. Null when the check wrote no such list (a check made before it was written,
 * or chunks that do not match the new findings'): the counts are then read from the findings themselves.
 */
async function newStockOf(t: Transaction, priceFileId: number, places: NewPlaces): Promise<{ partId: string; branchId: string; known: string } | null> {
  const lists = await getDb().query<{ seq: number; size: number; codes: string | null }>(
    `SELECT seq, size, json_extract(rows, '$.codes') AS codes FROM price_file_findings WHERE price_file_id = $1 AND kind = '${NEW_STOCK}' ORDER BY seq`,
    { bind: [priceFileId], type: QueryTypes.SELECT, transaction: t },
  )
  if (lists.length !== places.chunks.length || lists.some((l, i) => Number(l.seq) !== places.chunks[i]![0] || Number(l.size) !== places.chunks[i]![1])) return null
  const codes = lists.length ? JSON.parse(lists[0]!.codes ?? 'null') as unknown : []
  if (!Array.isArray(codes) || lists.some((l) => l.codes !== lists[0]!.codes)) return null
  const branches = await getDb().query<{ id: number; code: string }>('SELECT id, code FROM branches', { type: QueryTypes.SELECT, transaction: t })
  const idOf = new Map(branches.map((b) => [b.code, Number(b.id)]))
  const known = codes.flatMap((code, k) => (idOf.has(String(code)) ? [[k, idOf.get(String(code))!] as const] : []))
  const w = codes.length
  if (!known.length) return { partId: 'NULL', branchId: 'NULL', known: 'false' }
  return {
    partId: `${places.first} + ${places.offset} + s.key / ${w}`,
    branchId: `CASE s.key % ${w} ${known.map(([k, id]) => `WHEN ${k} THEN ${id}`).join(' ')} END`,
    known: known.length === w ? 'true' : `s.key % ${w} IN (${known.map(([k]) => k).join(', ')})`,
  }
}

/**
 * SQLite's per-row triggers on the rows an apply writes in bulk: off while it writes them, with what they would have
 * noted written once instead (see `withoutRowTriggers`). Status changes of existing parts keep theirs (a few rows).
 */
const BULK_TRIGGERS = [
  'parts_rev_insert', 'parts_search_insert', 'part_prices_bump_insert', 'part_prices_bump_update', 'stock_levels_rev_insert', 'stock_levels_rev_update',
] as const

/** What an apply records for its roll back. */
const APPLY_RECORDS = ['created', 'discontinued', 'reactivated']

/** Records the part ids `select` returns under `kind` (one chunk). */
async function record(t: Transaction, priceFileId: number, kind: string, select: string): Promise<void> {
  await getDb().query(`INSERT INTO price_file_findings (price_file_id, kind, seq, size, rows)
                       SELECT ${typed('$1', 'integer')}, '${kind}', 0, COUNT(*), COALESCE(${jsonArrayAgg('x.id')}, '[]') FROM (${select}) x`, { bind: [priceFileId], transaction: t })
}

/** SQL for the part ids recorded under `kind` for the price file bound as $1. */
export function recorded(kind: 'created' | 'discontinued' | 'reactivated'): string {
  return `SELECT ${jsonValue('r.value')} FROM price_file_findings f, ${jsonElements('f.rows', 'r')} WHERE f.price_file_id = $1 AND f.kind = '${kind}'`
}

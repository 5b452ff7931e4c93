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
import { getDb } from '../../utils/db'
import { jsonArrayAgg, jsonAt, jsonAtKey, jsonElements, jsonEntries, jsonPart, jsonValue, lastChanges, typed, withoutRowTriggers } from '../../utils/sql'
import { PriceVersion } from '../../models/catalogue'
import type { PriceFile } from '../../models/price-files'
import type { MissingAction } from '../../../shared/types/price-files'
import { activePriceVersionId } from '../price-versions'
import { conflict } from '../errors'
import { F, col, deleteFindings, findingsOf } from './findings'

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

  // a part added by hand since the check would collide with a "new" row: refuse rather than guess
  const refuseClash = async (upToPart?: number): Promise<void> => {
    const made = upToPart === undefined ? '' : ` AND p.id <= ${Number(upToPart)}` // not this apply's own
    const [clash] = await getDb().query<{ sku: string }>(
      `SELECT p.sku FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')}${made} LIMIT 1`,
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
    // PostgreSQL: looked for first (a statement that fails there ends the transaction); SQLite: the insert skips a
    // clash and the count tells (one pass over the findings fewer)
    if (!rowTriggersOff) await refuseClash()
    await q(`INSERT INTO parts (sku, type, product_line, description, specs, status, created_at, updated_at)
             SELECT ${col('sku')}, ${col('type')}, '', ${col('description')}, '{}', 'active', ${at}, ${at} FROM ${findingsOf(['new'])} f
              WHERE true${rowTriggersOff ? ' ON CONFLICT (sku) DO NOTHING' : ''}`, [u, now])
    if (rowTriggersOff) {
      const created = await lastChanges(t)
      if (created !== await one(`SELECT COALESCE(SUM(size), 0) AS n FROM price_file_findings WHERE price_file_id = $1 AND kind = 'new'`, [u])) {
        await refuseClash(lastPart)
        throw new Error('fewer parts were made than the file has new rows')
      }
      // what parts_search_insert and parts_rev_insert write for each new part, in the order the parts were written:
      // the part noted at the revision as it stands when the search trigger runs (before that part's own bump when
      // it is the newer trigger, as the migrations made them; after it otherwise), and the revision one up per part.
      // One INSERT numbers its rows one after another, so the n-th new part is the first id + n.
      const noted = revision + (newestFirst.indexOf('parts_search_insert') < newestFirst.indexOf('parts_rev_insert') ? 0 : 1)
      if (created > 0) {
        const first = await one('SELECT MIN(id) AS n FROM parts WHERE id > $1', [lastPart])
        if (await one('SELECT MAX(id) AS n FROM parts', []) !== first + created - 1) throw new Error('the new parts\' ids are not consecutive')
        await q(`INSERT INTO part_search_changes (part_id, revision)
                 SELECT id, id - $1 + $2 FROM parts WHERE id >= $1
                 ON CONFLICT (part_id) DO UPDATE SET revision = excluded.revision`, [first, noted])
      }
      await bump('catalogue', created)
      await record(t, u, 'created', `SELECT id FROM parts WHERE id > ${Number(lastPart)}`)
    } else {
      await record(t, u, 'created', `SELECT p.id FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')}`)
    }

    // the file's prices, for the parts whose prices move ('prices': [partId, list, trade, core, pack]) and the new parts
    await q(`INSERT INTO part_prices (part_id, list_price_minor, trade_cost_minor, core_deposit_minor, pack_quantity, price_version_id)
             SELECT ${jsonAt('f.v', 0, 'int')}, ${jsonAt('f.v', 1, 'int')}, ${jsonAt('f.v', 2, 'int')}, COALESCE(${jsonAt('f.v', 3, 'int')}, 0),
                    COALESCE(${jsonAt('f.v', 4, 'int')}, 1), ${typed('$2', 'integer')} FROM ${findingsOf(['prices'])} f
             UNION ALL
             SELECT p.id, ${col('newList')}, ${col('newTrade')}, COALESCE(${col('newCore')}, 0), COALESCE(${col('newPack')}, 1), ${typed('$2', 'integer')}
               FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')} WHERE true
             ON CONFLICT (part_id) DO UPDATE SET list_price_minor = excluded.list_price_minor, trade_cost_minor = excluded.trade_cost_minor,
               core_deposit_minor = excluded.core_deposit_minor, pack_quantity = excluded.pack_quantity, price_version_id = excluded.price_version_id`, [u, reserved.id])
    // part_prices_bump_insert / _update: one up per price row written
    if (rowTriggersOff) await bump('prices', await lastChanges(t))

    if (opts.missingParts === 'discontinue') {
      await record(t, u, 'discontinued', `SELECT p.id FROM ${findingsOf(['missing'])} f JOIN parts p ON p.id = ${col('partId')} WHERE p.status = 'active'`)
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
    const count = jsonAtKey('f.v', F.stock, 'b.code')
    await q(`INSERT INTO stock_levels (part_id, branch_id, quantity, updated_at)
             SELECT p.id, b.id, CAST(${count} AS INTEGER), ${at}
               FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')} CROSS JOIN branches b
              WHERE ${count} IS NOT NULL`, [u, now])
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

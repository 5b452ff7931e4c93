import type { QueryInterface } from 'sequelize'
import { ddlRunner, dropTrigger, revisionTriggers } from '../utils/sql'

/**
 * Prices in use, one row per part, and what a price file's check found, kept as a few JSON chunks per kind.
 *
 * Until now every version was a complete copy in `prices` (200,000 rows written per apply) and the check staged
 * one row per file row in `price_upload_rows`. Now:
 * - `part_prices` holds the prices in use: one row per part, with the version that last set it. Applying a file
 *   updates only the parts whose values move; every price read is one lookup by part.
 * - `price_upload_findings` holds the check's findings (new, changed, unchanged, missing, rejected), what the apply
 *   will write (prices with the values they replace, stock, parts back in use) and what an apply did to part
 *   statuses (created, discontinued, reactivated). A version is therefore its file's findings over the version
 *   before it; rolling back writes back the values the changed parts had, exactly.
 * `prices` keeps the complete copies written before this migration, read by nothing.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q(`CREATE TABLE part_prices (
    part_id INTEGER PRIMARY KEY REFERENCES parts (id),
    list_price_minor INTEGER NOT NULL,
    trade_cost_minor INTEGER,
    core_deposit_minor INTEGER NOT NULL DEFAULT 0,
    pack_quantity INTEGER NOT NULL DEFAULT 1,
    price_list_id INTEGER NOT NULL REFERENCES price_lists (id)
  )`)
  // a revision counter for prices, bumped by triggers whoever writes (the price-file check keeps a snapshot of them)
  await q('ALTER TABLE catalogue_revisions ADD COLUMN prices INTEGER NOT NULL DEFAULT 0')
  await revisionTriggers(qi, 'part_prices', 'bump', 'prices')
  await q(`INSERT INTO part_prices (part_id, list_price_minor, trade_cost_minor, core_deposit_minor, pack_quantity, price_list_id)
           SELECT part_id, list_price_minor, trade_cost_minor, COALESCE(core_deposit_minor, 0), COALESCE(pack_quantity, 1), price_list_id
             FROM prices WHERE price_list_id = (SELECT id FROM price_lists WHERE status = 'active' ORDER BY id DESC LIMIT 1)`)

  // one row per (upload, kind, chunk): `rows` is a JSON array of findings (see server/services/price-lists/findings.ts)
  await q(`CREATE TABLE price_upload_findings (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    upload_id INTEGER NOT NULL REFERENCES price_uploads (id) ON DELETE CASCADE,
    kind VARCHAR(12) NOT NULL,
    seq INTEGER NOT NULL,
    size INTEGER NOT NULL,
    rows TEXT NOT NULL
  )`)
  await q('CREATE UNIQUE INDEX price_upload_findings_kind ON price_upload_findings (upload_id, kind, seq)')

  // what earlier checks staged, carried over in the new form (SQLite only: a PostgreSQL database starts after this)
  const carry = qi.sequelize.getDialect() === 'postgres' ? async () => undefined : q
  await carry(`INSERT INTO price_upload_findings (upload_id, kind, seq, size, rows)
           SELECT upload_id, kind, 0, COUNT(*), json_group_array(json_array(row_number, sku, part_id, part_type, description,
                  old_list_minor, new_list_minor, old_trade_minor, new_trade_minor, old_core_minor, new_core_minor, old_pack, new_pack,
                  change_pct, large, json(stock), columns, reason, json(raw)))
             FROM (SELECT * FROM price_upload_rows ORDER BY id) GROUP BY upload_id, kind`)
  // and what the apply reads: new prices of changed parts, stock counts, discontinued parts the file prices again
  await carry(`INSERT INTO price_upload_findings (upload_id, kind, seq, size, rows)
           SELECT r.upload_id, 'prices', 0, COUNT(*), json_group_array(json_array(r.part_id, r.new_list_minor, r.new_trade_minor, r.new_core_minor, r.new_pack,
                  r.old_list_minor, r.old_trade_minor, r.old_core_minor, r.old_pack, CASE WHEN r.old_list_minor IS NULL THEN NULL ELSE u.base_price_list_id END))
             FROM price_upload_rows r JOIN price_uploads u ON u.id = r.upload_id WHERE r.kind = 'changed' GROUP BY r.upload_id`)
  await carry(`INSERT INTO price_upload_findings (upload_id, kind, seq, size, rows)
           SELECT upload_id, 'stock', 0, COUNT(*), json_group_array(json_array(part_id, json(stock)))
             FROM price_upload_rows WHERE kind IN ('changed', 'unchanged') AND stock IS NOT NULL GROUP BY upload_id`)
  await carry(`INSERT INTO price_upload_findings (upload_id, kind, seq, size, rows)
           SELECT r.upload_id, 'revive', 0, COUNT(*), json_group_array(r.part_id)
             FROM price_upload_rows r JOIN parts p ON p.id = r.part_id AND p.status = 'discontinued'
            WHERE r.kind IN ('changed', 'unchanged') GROUP BY r.upload_id`)
  await carry(`INSERT INTO price_upload_findings (upload_id, kind, seq, size, rows)
           SELECT upload_id, part_status_change, 0, COUNT(*), json_group_array(part_id)
             FROM price_upload_rows WHERE part_status_change IS NOT NULL GROUP BY upload_id, part_status_change`)
  await q('DROP TABLE price_upload_rows')
}

export async function down(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q(`CREATE TABLE price_upload_rows (
    id INTEGER PRIMARY KEY AUTOINCREMENT, upload_id INTEGER NOT NULL REFERENCES price_uploads (id) ON DELETE CASCADE,
    kind VARCHAR(10) NOT NULL, row_number INTEGER, sku VARCHAR(60), part_id INTEGER, part_type VARCHAR(24), description VARCHAR(300),
    old_list_minor INTEGER, new_list_minor INTEGER, old_trade_minor INTEGER, new_trade_minor INTEGER, old_core_minor INTEGER,
    new_core_minor INTEGER, old_pack INTEGER, new_pack INTEGER, change_pct FLOAT, large TINYINT(1) NOT NULL DEFAULT 0, stock TEXT,
    columns VARCHAR(300), reason TEXT, raw TEXT, part_status_change VARCHAR(16))`)
  await q('CREATE INDEX price_upload_rows_upload_id_kind_row_number ON price_upload_rows (upload_id, kind, row_number)')
  await q('CREATE INDEX price_upload_rows_upload_id_part_id ON price_upload_rows (upload_id, part_id)')
  await q(`INSERT INTO price_upload_rows (upload_id, kind, row_number, sku, part_id, part_type, description, old_list_minor, new_list_minor,
             old_trade_minor, new_trade_minor, old_core_minor, new_core_minor, old_pack, new_pack, change_pct, large, stock, columns, reason, raw)
           SELECT f.upload_id, f.kind, j.value->>0, j.value->>1, j.value->>2, j.value->>3, j.value->>4, j.value->>5, j.value->>6, j.value->>7,
                  j.value->>8, j.value->>9, j.value->>10, j.value->>11, j.value->>12, j.value->>13, j.value->>14, j.value->'$[15]', j.value->>16,
                  j.value->>17, j.value->'$[18]'
             FROM price_upload_findings f, json_each(f.rows) j WHERE f.kind IN ('new', 'changed', 'unchanged', 'missing', 'rejected')`)
  await q('DROP TABLE price_upload_findings')
  for (const op of ['insert', 'update', 'delete']) await dropTrigger(qi, 'part_prices', `part_prices_bump_${op}`)
  await q('DROP TABLE part_prices')
  await q('ALTER TABLE catalogue_revisions DROP COLUMN prices')
}

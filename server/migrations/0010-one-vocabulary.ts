import type { QueryInterface } from 'sequelize'
import { ddlRunner } from '../utils/sql'

/**
 * One name per idea, from the tables to the screen (the glossary in DEVELOPERS.md):
 * - the uploaded supplier file and its check is a *price file* (`price_files`, its findings `price_file_findings`);
 * - what an applied file makes is a *price version* (`price_versions`, referenced as `price_version_id`);
 * - the prices in use stay `part_prices`; `prices`, the complete copies kept from before migration 0009 and read
 *   by nothing, goes;
 * - an order that is paid or on account and waits to be picked is `confirmed` (it was stored as `queued`).
 * - a garage's standing is its *trade account* and its request a *trade application*, in audit actions too.
 * Audit rows are renamed too, so the history reads in the same words.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q('DROP TABLE IF EXISTS prices')

  await q('DROP INDEX IF EXISTS price_lists_one_active')
  await q('ALTER TABLE price_lists RENAME TO price_versions')
  await q(`CREATE UNIQUE INDEX price_versions_one_active ON price_versions (status) WHERE status = 'active'`)
  await q('ALTER TABLE part_prices RENAME COLUMN price_list_id TO price_version_id')

  await q('DROP INDEX IF EXISTS price_uploads_status')
  await q('ALTER TABLE price_uploads RENAME TO price_files')
  await q('CREATE INDEX price_files_status ON price_files (status)')
  for (const [from, to] of [['base_price_list_id', 'base_price_version_id'], ['price_list_id', 'price_version_id'], ['previous_price_list_id', 'previous_price_version_id']]) {
    await q(`ALTER TABLE price_files RENAME COLUMN ${from} TO ${to}`)
  }

  await q('DROP INDEX IF EXISTS price_upload_findings_kind')
  await q('ALTER TABLE price_upload_findings RENAME TO price_file_findings')
  await q('ALTER TABLE price_file_findings RENAME COLUMN upload_id TO price_file_id')
  await q('CREATE UNIQUE INDEX price_file_findings_kind ON price_file_findings (price_file_id, kind, seq)')

  await q(`UPDATE orders SET status = 'confirmed' WHERE status = 'queued'`)
  await q(`UPDATE audit_log SET action = 'priceVersion.' || substr(action, 11) WHERE action LIKE 'priceList.%'`)
  await q(`UPDATE audit_log SET entity = 'price_version' WHERE entity = 'price_list'`)
  await q(`UPDATE audit_log SET entity = 'price_file' WHERE entity = 'price_upload'`)
  await q(`UPDATE audit_log SET action = 'tradeAccount.' || substr(action, 9) WHERE action LIKE 'account.%'`)
  await q(`UPDATE audit_log SET action = 'tradeApplication.' || substr(action, 13) WHERE action LIKE 'application.%'`)
}

export async function down(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q(`UPDATE audit_log SET action = 'application.' || substr(action, 18) WHERE action LIKE 'tradeApplication.%'`)
  await q(`UPDATE audit_log SET action = 'account.' || substr(action, 14) WHERE action LIKE 'tradeAccount.%'`)
  await q(`UPDATE audit_log SET entity = 'price_upload' WHERE entity = 'price_file'`)
  await q(`UPDATE audit_log SET entity = 'price_list' WHERE entity = 'price_version'`)
  await q(`UPDATE audit_log SET action = 'priceList.' || substr(action, 14) WHERE action LIKE 'priceVersion.%'`)
  await q(`UPDATE orders SET status = 'queued' WHERE status = 'confirmed'`)

  await q('DROP INDEX IF EXISTS price_file_findings_kind')
  await q('ALTER TABLE price_file_findings RENAME COLUMN price_file_id TO upload_id')
  await q('ALTER TABLE price_file_findings RENAME TO price_upload_findings')
  await q('CREATE UNIQUE INDEX price_upload_findings_kind ON price_upload_findings (upload_id, kind, seq)')

  for (const [from, to] of [['base_price_version_id', 'base_price_list_id'], ['price_version_id', 'price_list_id'], ['previous_price_version_id', 'previous_price_list_id']]) {
    await q(`ALTER TABLE price_files RENAME COLUMN ${from} TO ${to}`)
  }
  await q('DROP INDEX IF EXISTS price_files_status')
  await q('ALTER TABLE price_files RENAME TO price_uploads')
  await q('CREATE INDEX price_uploads_status ON price_uploads (status)')

  await q('ALTER TABLE part_prices RENAME COLUMN price_version_id TO price_list_id')
  await q('DROP INDEX IF EXISTS price_versions_one_active')
  await q('ALTER TABLE price_versions RENAME TO price_lists')
  await q(`CREATE UNIQUE INDEX price_lists_one_active ON price_lists (status) WHERE status = 'active'`)
  // the pre-0009 copies are not restored: the table comes back empty, as 0002 made it
  await q(`CREATE TABLE prices (
    price_list_id INTEGER NOT NULL REFERENCES price_lists (id), part_id INTEGER NOT NULL REFERENCES parts (id),
    list_price_minor INTEGER NOT NULL, trade_cost_minor INTEGER, core_deposit_minor INTEGER NOT NULL DEFAULT 0,
    pack_quantity INTEGER NOT NULL DEFAULT 1, PRIMARY KEY (price_list_id, part_id))`)
}

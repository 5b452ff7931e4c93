import { DataTypes, type QueryInterface } from 'sequelize'
import { dropTrigger, revisionTriggers } from '../utils/sql'

/** Tables whose changes make cached catalogue answers (search index, vehicle-parts lists) stale. */
export const CATALOGUE_TABLES = ['vehicles', 'vehicle_options', 'vehicle_brakes', 'parts', 'part_oe_numbers', 'supersessions', 'fitments'] as const

/**
 * Catalogue additions:
 * - a garage setting that lets its technicians see trade prices (off unless the garage turns it on);
 * - revision counters bumped by triggers on every change to the catalogue tables and to stock, whoever writes
 *   (routes, price-file imports, orders, scripts). The server reads them with each catalogue request and drops
 *   its caches when they moved, so no writer has to remember to tell it;
 * - an index for "which old SKUs does this part replace" on the part page.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('organisations', 'technicians_see_prices', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false })
  await qi.addIndex('supersessions', ['new_part_id'])
  const q = (sql: string) => qi.sequelize.query(sql)
  await q(`CREATE TABLE catalogue_revisions (
    id INTEGER PRIMARY KEY CHECK (id = 1),
    catalogue INTEGER NOT NULL DEFAULT 0,
    stock INTEGER NOT NULL DEFAULT 0
  )`)
  await q('INSERT INTO catalogue_revisions (id, catalogue, stock) VALUES (1, 0, 0)')
  for (const table of CATALOGUE_TABLES) await revisionTriggers(qi, table, 'rev', 'catalogue')
  await revisionTriggers(qi, 'stock_levels', 'rev', 'stock')
}

export async function down(qi: QueryInterface): Promise<void> {
  const q = (sql: string) => qi.sequelize.query(sql)
  for (const table of [...CATALOGUE_TABLES, 'stock_levels']) {
    for (const op of ['insert', 'update', 'delete']) await dropTrigger(qi, table, `${table}_rev_${op}`)
  }
  await q('DROP TABLE IF EXISTS catalogue_revisions')
  await qi.removeIndex('supersessions', ['new_part_id'])
  await qi.removeColumn('organisations', 'technicians_see_prices')
}

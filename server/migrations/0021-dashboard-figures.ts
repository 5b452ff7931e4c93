import type { QueryInterface } from 'sequelize'
import {
  commitRevisionTriggers, ddlRunner, dropCommitRevisionTriggers, dropOrganisationMarkTriggers, organisationMarkTriggers,
} from '../utils/sql'

/**
 * What the distributor's dashboard needs to answer a year of trade quickly:
 * - covering indexes, so the range's sold lines are summed from the indexes alone (orders by day with their status,
 *   garage and branch; each order's lines with what the figures read), and open back-orders are found directly;
 * - `open_items`: what is still open of each charge on a garage's ledger, kept by the statement's rule, with the day
 *   its payment days run from; `open_item_marks` counts the writes to each garage's ledger, allocations and documents
 *   (triggers, whoever writes), so only the garages written since are worked out again (all of them after this
 *   migration: `worked` starts below `revision`);
 * - `catalogue_revisions.trade`: one more for each transaction writing what the dashboard reads, so a finished
 *   answer can be kept until any of it changes.
 */
export const TRADE_TABLES = ['orders', 'order_lines', 'part_returns', 'ledger_entries', 'payment_allocations', 'documents', 'organisations', 'branches', 'price_versions'] as const
const MARKED_TABLES = ['ledger_entries', 'payment_allocations', 'documents'] as const

export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q('CREATE INDEX orders_sold_by_day ON orders (created_at, status, id, organisation_id, branch_id)')
  await q(`CREATE INDEX order_lines_figures ON order_lines
    (order_id, state, line_group, source, split_from_line_id, part_id, sku, quantity, line_net_minor)`)
  await q('CREATE INDEX order_lines_open_back_orders ON order_lines (source, state, order_id, quantity)')
  // fresh statistics, so the planner knows the new indexes cover these reads
  await q('ANALYZE orders')
  await q('ANALYZE order_lines')
  await q(`CREATE TABLE open_items (
    entry_id INTEGER PRIMARY KEY REFERENCES ledger_entries(id) ON DELETE CASCADE,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id),
    -- the local day its payment days run from; NULL while its order is not invoiced
    due_from VARCHAR(10) NULL,
    open_minor BIGINT NOT NULL
  )`)
  await q('CREATE INDEX open_items_organisation ON open_items (organisation_id)')
  await q(`CREATE TABLE open_item_marks (
    organisation_id INTEGER PRIMARY KEY REFERENCES organisations(id) ON DELETE CASCADE,
    revision INTEGER NOT NULL DEFAULT 0,
    worked INTEGER NOT NULL DEFAULT -1,
    -- the time zone the local days of open_items were worked out in
    time_zone VARCHAR(64) NOT NULL DEFAULT ''
  )`)
  await q(`INSERT INTO open_item_marks (organisation_id)
    SELECT DISTINCT organisation_id FROM ledger_entries UNION SELECT DISTINCT organisation_id FROM payment_allocations`)
  for (const table of MARKED_TABLES) await organisationMarkTriggers(qi, table, 'open_item_marks')
  await q('ALTER TABLE catalogue_revisions ADD COLUMN trade INTEGER NOT NULL DEFAULT 0')
  for (const table of TRADE_TABLES) await commitRevisionTriggers(qi, table, 'trade')
}

export async function down(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  for (const table of TRADE_TABLES) await dropCommitRevisionTriggers(qi, table, 'trade')
  await q('ALTER TABLE catalogue_revisions DROP COLUMN trade')
  for (const table of MARKED_TABLES) await dropOrganisationMarkTriggers(qi, table)
  await q('DROP TABLE IF EXISTS open_item_marks')
  await q('DROP TABLE IF EXISTS open_items')
  await q('DROP INDEX IF EXISTS order_lines_open_back_orders')
  await q('DROP INDEX IF EXISTS order_lines_figures')
  await q('DROP INDEX IF EXISTS orders_sold_by_day')
}

import type { QueryInterface } from 'sequelize'
import { ddlRunner, dropHourMarkTriggers, hourMarkTriggers } from '../utils/sql'

/**
 * The distributor's dashboard summed per local day and kept (day-figures.ts), so a year is 365 kept rows plus the days
 * written since, instead of a year of order lines on every look:
 * - `trade_day_marks`: one counter per UTC hour, moved by triggers whenever an order, one of its lines (the hour of
 *   its order) or a return (its own hour) is written, whoever writes;
 * - `trade_day_figures`: a day's figures in one time zone, with the sum of its hours' counters they were worked out
 *   at (`stamp`) and what else they depend on (`context`: the price versions and prices the margin used). A day
 *   whose hours' counters add up to more, or whose context differs, is summed again on the next look.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q('CREATE TABLE trade_day_marks (hour VARCHAR(13) PRIMARY KEY, revision BIGINT NOT NULL DEFAULT 0)')
  await q(`CREATE TABLE trade_day_figures (
    time_zone VARCHAR(64) NOT NULL,
    day VARCHAR(10) NOT NULL,
    stamp BIGINT NOT NULL,
    context VARCHAR(64) NOT NULL,
    figures TEXT NOT NULL,
    PRIMARY KEY (time_zone, day)
  )`)
  await hourMarkTriggers(qi, 'orders', (row) => `${row}.created_at`)
  await hourMarkTriggers(qi, 'order_lines', (row) => `(SELECT o.created_at FROM orders o WHERE o.id = ${row}.order_id)`)
  await hourMarkTriggers(qi, 'part_returns', (row) => `${row}.created_at`)
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const table of ['orders', 'order_lines', 'part_returns']) await dropHourMarkTriggers(qi, table)
  const q = ddlRunner(qi)
  await q('DROP TABLE IF EXISTS trade_day_figures')
  await q('DROP TABLE IF EXISTS trade_day_marks')
}

import { QueryTypes, type QueryInterface } from 'sequelize'

/**
 * Running on PostgreSQL with several server processes (nothing changes on SQLite):
 * - the throttles' counters live in `rate_limits` (rate-limiter-flexible's PostgreSQL store), so every process
 *   counts the same attempts;
 * - every money column (amounts in minor units, `*_minor`) becomes BIGINT, so balances and sums that
 *   grow over years of trade never overflow 32 bits (SQLite stores any integer in up to 8 bytes already); the
 *   driver reads BIGINT back as a JS number (server/utils/db.ts).
 */
export async function up(qi: QueryInterface): Promise<void> {
  if (qi.sequelize.getDialect() !== 'postgres') return
  for (const c of await moneyColumns(qi, 'integer')) {
    await qi.sequelize.query(`ALTER TABLE "${c.table}" ALTER COLUMN "${c.column}" TYPE BIGINT`)
  }
  // the table as rate-limiter-flexible's PostgreSQL store defines it (made here, so processes starting together never race to make it)
  await qi.sequelize.query('CREATE TABLE rate_limits (key VARCHAR(255) PRIMARY KEY, points INTEGER NOT NULL DEFAULT 0, expire BIGINT)')
}

export async function down(qi: QueryInterface): Promise<void> {
  if (qi.sequelize.getDialect() !== 'postgres') return
  await qi.sequelize.query('DROP TABLE IF EXISTS rate_limits')
  for (const c of await moneyColumns(qi, 'bigint')) {
    await qi.sequelize.query(`ALTER TABLE "${c.table}" ALTER COLUMN "${c.column}" TYPE INTEGER`)
  }
}

function moneyColumns(qi: QueryInterface, type: string): Promise<{ table: string; column: string }[]> {
  return qi.sequelize.query<{ table: string; column: string }>(
    `SELECT table_name AS "table", column_name AS "column" FROM information_schema.columns
      WHERE table_schema = current_schema() AND column_name LIKE '%\\_minor' AND data_type = :type ORDER BY table_name, column_name`,
    { replacements: { type }, type: QueryTypes.SELECT },
  )
}

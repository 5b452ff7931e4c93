import { QueryTypes, type QueryInterface } from 'sequelize'

/**
 * On PostgreSQL, every money column (amounts in minor units, `*_minor`) becomes BIGINT, so balances and sums that
 * grow over years of trade never overflow 32 bits. SQLite stores any integer in up to 8 bytes already: nothing
 * changes there. The driver reads BIGINT back as a JS number (server/utils/db.ts).
 */
export async function up(qi: QueryInterface): Promise<void> {
  if (qi.sequelize.getDialect() !== 'postgres') return
  for (const c of await moneyColumns(qi, 'integer')) {
    await qi.sequelize.query(`ALTER TABLE "${c.table}" ALTER COLUMN "${c.column}" TYPE BIGINT`)
  }
}

export async function down(qi: QueryInterface): Promise<void> {
  if (qi.sequelize.getDialect() !== 'postgres') return
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

import type { QueryInterface } from 'sequelize'
import { dropTrigger } from '../utils/sql'

/** The tables whose rows the part-search index reads, with the column naming the part each row belongs to. */
export const PART_SEARCH_SOURCES = [
  { table: 'parts', partColumn: 'id' },
  { table: 'part_oe_numbers', partColumn: 'part_id' },
  { table: 'supersessions', partColumn: 'new_part_id' },
] as const

/**
 * Which parts changed, and at which catalogue revision: one row per part (the last change wins), written by
 * triggers on the tables the part-search index reads, whoever writes. A process that loads a saved index re-reads
 * only the parts noted at or after the revision the index was saved at, instead of building it again. The revision
 * noted is the counter as the trigger saw it (before or after the same statement's own bump), so readers ask for
 * `revision >= saved` and at worst re-read a part twice.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = (sql: string) => qi.sequelize.query(sql)
  const pg = qi.sequelize.getDialect() === 'postgres'
  await q('CREATE TABLE part_search_changes (part_id INTEGER PRIMARY KEY, revision INTEGER NOT NULL)')
  await q('CREATE INDEX part_search_changes_revision ON part_search_changes (revision)')
  const note = (ids: string) => `INSERT INTO part_search_changes (part_id, revision) ${ids}
    ON CONFLICT (part_id) DO UPDATE SET revision = excluded.revision`
  const rev = '(SELECT catalogue FROM catalogue_revisions WHERE id = 1)'
  for (const { table, partColumn: c } of PART_SEARCH_SOURCES) {
    for (const op of ['INSERT', 'UPDATE', 'DELETE'] as const) {
      const name = `${table}_search_${op.toLowerCase()}`
      const rows = op === 'INSERT' ? ['NEW'] : op === 'DELETE' ? ['OLD'] : ['OLD', 'NEW']
      if (!pg) {
        const body = rows.map((r) => `${note(`SELECT ${r}.${c}, ${rev} WHERE ${r}.${c} IS NOT NULL`)};`).join(' ')
        await q(`CREATE TRIGGER ${name} AFTER ${op} ON ${table} BEGIN ${body} END`)
        continue
      }
      // once per statement with its transition tables (a price file writing 200,000 parts runs it once); a
      // trigger with transition tables takes one event, hence one per operation
      const sets = rows.map((r) => `SELECT ${c} FROM ${r === 'NEW' ? 'new_rows' : 'old_rows'} WHERE ${c} IS NOT NULL`).join(' UNION ')
      const referencing = rows.map((r) => (r === 'NEW' ? 'NEW TABLE AS new_rows' : 'OLD TABLE AS old_rows')).join(' ')
      await q(`CREATE OR REPLACE FUNCTION ${name}() RETURNS trigger LANGUAGE plpgsql AS $$
        BEGIN ${note(`SELECT DISTINCT x.${c}, ${rev} FROM (${sets}) x`)}; RETURN NULL; END $$`)
      await q(`CREATE TRIGGER ${name} AFTER ${op} ON ${table} REFERENCING ${referencing} FOR EACH STATEMENT EXECUTE FUNCTION ${name}()`)
    }
  }
}

export async function down(qi: QueryInterface): Promise<void> {
  const pg = qi.sequelize.getDialect() === 'postgres'
  for (const { table } of PART_SEARCH_SOURCES) {
    for (const op of ['insert', 'update', 'delete']) {
      await dropTrigger(qi, table, `${table}_search_${op}`)
      if (pg) await qi.sequelize.query(`DROP FUNCTION IF EXISTS ${table}_search_${op}()`)
    }
  }
  await qi.sequelize.query('DROP TABLE part_search_changes')
}

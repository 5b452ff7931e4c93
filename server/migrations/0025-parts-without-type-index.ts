import type { QueryInterface } from 'sequelize'
import { ddlRunner } from '../utils/sql'

/**
 * The index on `parts.type` goes. No statement reads parts by type through it: the part search filters types in
 * its own index (search-index.ts), and the fitting parts of a vehicle are reached through `fitments` by vehicle,
 * then each part by id (the query plans name no other path). With ten or so types, each holding a tenth of the
 * catalogue, it would not narrow a search much either. It cost every new part an entry: 85 ms of a 200,000-part
 * price file's apply on SQLite (bench/README.md).
 */
export async function up(qi: QueryInterface): Promise<void> {
  await ddlRunner(qi)('DROP INDEX IF EXISTS parts_type')
}

export async function down(qi: QueryInterface): Promise<void> {
  await ddlRunner(qi)('CREATE INDEX IF NOT EXISTS parts_type ON parts (type)')
}

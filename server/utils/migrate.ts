import { SequelizeStorage, Umzug } from 'umzug'
import { QueryTypes, type QueryInterface, type Sequelize } from 'sequelize'
import { migrations } from '../migrations/index'
import pg from 'pg'
import { databaseUrl, getDb } from './db'
import { tableExists } from './sql'

function migrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: migrations.map((m) => ({
      name: m.name,
      up: async ({ context }) => m.up(context),
      down: async ({ context }) => m.down(context),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  })
}

/** Applies pending migrations; returns the names applied by this call. */
export async function migrateUp(sequelize: Sequelize = getDb()): Promise<string[]> {
  return oneMigratorAtATime(sequelize, async () => (await migrator(sequelize).up()).map((m) => m.name))
}

/** Any number, the same in every process: the advisory lock the migrating process holds on PostgreSQL. */
const MIGRATION_LOCK = 72_190_019

/**
 * Several processes starting together on one PostgreSQL database migrate one after another (an advisory lock
 * held on its own connection); the later ones find nothing left to apply. SQLite's write lock does the same.
 */
async function oneMigratorAtATime<T>(sequelize: Sequelize, fn: () => Promise<T>): Promise<T> {
  if (sequelize.getDialect() !== 'postgres') return fn()
  const client = new pg.Client({ connectionString: databaseUrl() })
  await client.connect()
  try {
    await client.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK])
    return await fn()
  } finally {
    await client.end().catch(() => {})
  }
}

/**
 * How many migrations the database has recorded as applied: a plain read, because umzug's storage first runs
 * `CREATE TABLE IF NOT EXISTS`, which SQLite treats as a write and makes wait for the write lock (measured:
 * /api/health p99 150-250 ms while a price file was being staged, 25-60 ms for the read alone).
 */
export async function appliedMigrationCount(sequelize: Sequelize = getDb()): Promise<number> {
  if (!(await tableExists(sequelize, 'schema_migrations'))) return 0
  const [row] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM schema_migrations', { type: QueryTypes.SELECT })
  return Number(row?.n ?? 0)
}

export async function pendingMigrationCount(sequelize: Sequelize = getDb()): Promise<number> {
  return (await migrator(sequelize).pending()).length
}

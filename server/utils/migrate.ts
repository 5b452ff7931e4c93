import { SequelizeStorage, Umzug } from 'umzug'
import type { QueryInterface, Sequelize } from 'sequelize'
import { migrations } from '../migrations/index'
import { getDb } from './db'

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
  const done = await migrator(sequelize).up()
  return done.map((m) => m.name)
}

/** How many migrations the database has recorded as applied. */
export async function appliedMigrationCount(sequelize: Sequelize = getDb()): Promise<number> {
  return (await migrator(sequelize).executed()).length
}

export async function pendingMigrationCount(sequelize: Sequelize = getDb()): Promise<number> {
  return (await migrator(sequelize).pending()).length
}

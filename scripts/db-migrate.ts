/** npm run db:migrate: applies pending migrations to DATABASE_URL (default sqlite:./data/boreline.sqlite). */
import { closeDb, databaseUrl, getDb } from '../server/utils/db'
import { appliedMigrationCount, migrateUp } from '../server/utils/migrate'

const applied = await migrateUp(getDb())
console.log(applied.length ? `Applied: ${applied.join(', ')}` : 'Nothing to apply.')
console.log(`${await appliedMigrationCount(getDb())} migrations recorded in ${databaseUrl().replace(/\/\/([^:/@]+):[^@]*@/, '//$1:***@')}`)
await closeDb()

/** npm run db:seed: migrates, then writes the invented demo scenario (idempotent). */
import { closeDb, getDb } from '../server/utils/db'
import { migrateUp } from '../server/utils/migrate'
import { initModels } from '../server/models/index'
import { runSeed } from '../server/seed/index'

await migrateUp(getDb())
initModels(getDb())
await runSeed((s) => console.log(`seed ${s}`))
await closeDb()

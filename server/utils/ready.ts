import { initModels } from '../models/index'
import { migrateUp } from './migrate'
import { getDb } from './db'

let ready: Promise<void> | undefined

/**
 * Applies pending migrations and binds the models once. Nitro does not await async plugins, so the first
 * middleware awaits this too; a failure is retried on the next request (health reports it as 503).
 */
export function databaseReady(): Promise<void> {
  ready ??= (async () => {
    const applied = await migrateUp(getDb())
    if (applied.length) console.info(`[boreline] applied migrations: ${applied.join(', ')}`)
    initModels(getDb())
  })().catch((err) => {
    ready = undefined
    throw err
  })
  return ready
}

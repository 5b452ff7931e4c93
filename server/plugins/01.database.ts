/**
 * At start: refuse a weak session secret in production, create the uploads folder (generated, never in the
 * repository), then migrate and bind the models. WAL checkpoints run in the background (server/utils/db.ts); on
 * PostgreSQL the process listens for the other processes' writes.
 */
import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { databaseReady } from '../utils/ready'
import { checkpointInBackground, closeDb, listenForWrites } from '../utils/db'

export default defineNitroPlugin((nitro) => {
  const config = useRuntimeConfig()
  if (!process.env.DATABASE_URL && config.databaseUrl) process.env.DATABASE_URL = config.databaseUrl
  if (process.env.NODE_ENV === 'production' && !import.meta.dev) {
    const pw = String(config.session?.password ?? '')
    if (pw.length < 32) {
      console.error('[boreline] NUXT_SESSION_PASSWORD is missing or shorter than 32 characters: refusing to start.')
      process.exit(1)
    }
  }
  mkdirSync(resolve(String(config.uploadsDir || './uploads')), { recursive: true })
  checkpointInBackground() // before the first query opens a connection
  databaseReady().catch((err) => console.error('[boreline] database not ready:', err?.message ?? err))
  // PostgreSQL: hear the other processes' writes, so this one's caches drop with them
  listenForWrites().catch((err) => console.error('[boreline] not listening for writes:', err?.message ?? err))
  nitro.hooks.hook('close', async () => { await closeDb() })
})

/**
 * The job queue shared by every server process on PostgreSQL (pg-boss, in the database's `pgboss` schema): a job
 * is handed to exactly one process, and jobs waiting or cut short by a restart are still there afterwards.
 * Not used on SQLite (one process: jobs run in it). Plain Node.
 */
import PgBoss from 'pg-boss'
import { databaseUrl } from './db'

let boss: Promise<PgBoss> | undefined

/** The started queue (started once per process, on first use). */
export function jobQueue(): Promise<PgBoss> {
  boss ??= (async () => {
    const b = new PgBoss({ connectionString: databaseUrl(), schema: 'pgboss', max: 4 })
    b.on('error', (err) => console.error('[boreline] job queue:', err?.message ?? err))
    await b.start()
    return b
  })().catch((err) => {
    boss = undefined
    throw err
  })
  return boss
}

/** Stops taking jobs and lets the running ones finish (a few seconds at most): the server is closing. */
export async function stopJobQueue(): Promise<void> {
  const b = boss
  boss = undefined
  if (b) await (await b.catch(() => undefined))?.stop({ graceful: true, timeout: 5_000 })
}

/** A queue name from a job's name ("order sweep" -> "boreline-order-sweep"). */
export function queueName(name: string): string {
  return `boreline-${name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}`
}

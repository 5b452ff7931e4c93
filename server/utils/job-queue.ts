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

let making: Promise<unknown> = Promise.resolve()

/**
 * Makes a queue if it is not there yet. pg-boss makes each queue's table as it does, and two of those at once
 * can deadlock: this process makes them one at a time, and a deadlock with another process is tried again.
 */
export function ensureQueue(name: string, options: Omit<PgBoss.Queue, 'name'>): Promise<PgBoss> {
  const made = making.then(async () => {
    const boss = await jobQueue()
    for (let attempt = 1; ; attempt++) {
      try {
        await boss.createQueue(name, { ...options, name })
        return boss
      } catch (err) {
        if (attempt >= 5) throw err
        await new Promise((r) => setTimeout(r, 100 * attempt + Math.random() * 100))
      }
    }
  })
  making = made.catch(() => undefined)
  return made
}

/** A queue name from a job's name ("order sweep" -> "boreline-order-sweep"). */
export function queueName(name: string): string {
  return `boreline-${name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}`
}

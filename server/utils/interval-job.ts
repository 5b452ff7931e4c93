/**
 * A job a Nitro plugin runs every few seconds in the background: the period comes from an environment setting
 * (0 or not a number turns it off), a run never overlaps the one before, it waits for the database, failures are
 * logged and the next run tries again, and the timer stops when Nitro closes.
 *
 * On PostgreSQL several processes share the database, so the job runs once across them: every process offers a
 * job to the shared queue each period (at most one is made per period, `singletonSeconds`), the queue hands it to
 * exactly one process, and its `singleton` policy never lets two be active at once.
 */
import type { NitroApp } from 'nitropack/types'
import { isPostgres } from './db'
import { ensureQueue, queueName, stopJobQueue } from './job-queue'
import { databaseReady } from './ready'

interface IntervalJob<T> { setting: string; defaultSeconds: number; name: string; run: () => Promise<T>; report: (result: T) => void }

export function everyFewSeconds<T>(nitro: NitroApp, o: IntervalJob<T>): void {
  const seconds = Number(process.env[o.setting] ?? o.defaultSeconds)
  if (!Number.isFinite(seconds) || seconds <= 0) return
  if (isPostgres()) return onceAcrossProcesses(nitro, seconds, o)
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    runLogged(o).finally(() => { running = false })
  }, seconds * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
}

function runLogged<T>(o: IntervalJob<T>): Promise<void> {
  return databaseReady()
    .then(o.run)
    .then(o.report)
    .catch((err) => console.error(`[boreline] ${o.name} failed:`, err?.message ?? err))
}

function onceAcrossProcesses<T>(nitro: NitroApp, seconds: number, o: IntervalJob<T>): void {
  const queue = queueName(o.name)
  let timer: NodeJS.Timeout | undefined
  let closed = false
  databaseReady()
    .then(() => ensureQueue(queue, { policy: 'singleton', retryLimit: 0, expireInSeconds: Math.max(600, seconds * 2) }))
    .then(async (boss) => {
      await boss.work(queue, { pollingIntervalSeconds: Math.min(Math.max(0.5, seconds / 2), 2) }, () => runLogged(o))
      const offer = () => { boss.send(queue, {}, { singletonSeconds: Math.max(1, Math.round(seconds)) }).catch((err) => console.error(`[boreline] ${o.name} not queued:`, err?.message ?? err)) }
      if (closed) return
      timer = setInterval(offer, seconds * 1000)
      timer.unref()
    })
    .catch((err) => console.error(`[boreline] ${o.name} not scheduled:`, err?.message ?? err))
  nitro.hooks.hook('close', async () => {
    closed = true
    clearInterval(timer)
    await stopJobQueue()
  })
}

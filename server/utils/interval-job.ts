/**
 * A job a Nitro plugin runs every few seconds in the background: the period comes from an environment setting
 * (0 or not a number turns it off), a run never overlaps the one before, it waits for the database, failures are
 * logged and the next run tries again, and the timer stops when Nitro closes.
 */
import type { NitroApp } from 'nitropack/types'
import { databaseReady } from './ready'

export function everyFewSeconds<T>(nitro: NitroApp, o: { setting: string; defaultSeconds: number; name: string; run: () => Promise<T>; report: (result: T) => void }): void {
  const seconds = Number(process.env[o.setting] ?? o.defaultSeconds)
  if (!Number.isFinite(seconds) || seconds <= 0) return
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    databaseReady()
      .then(o.run)
      .then(o.report)
      .catch((err) => console.error(`[boreline] ${o.name} failed:`, err?.message ?? err))
      .finally(() => { running = false })
  }, seconds * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
}

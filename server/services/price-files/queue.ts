/**
 * The queue of price-file checks in this process: one check at a time (a second file waits its turn: never two
 * checks interleaved, each would slow the other and both hold a snapshot), with the stage and progress of the one
 * running and of those waiting, for the pages that poll them. The queue lives in memory, so at start the files a
 * restart cut short are queued again.
 *
 * On PostgreSQL (several processes) a check is a job of the shared queue (server/utils/job-queue.ts): one process
 * takes it, one check at a time per process, and a check cut short by a restart is taken again once its job
 * expires. Its stage and progress are also written to the price file's row (a few times a second at most), so a
 * page polling through another process shows them.
 */
import type { NitroApp } from 'nitropack/types'
import { QueryTypes } from 'sequelize'
import { getDb, isPostgres, withWrite } from '../../utils/db'
import { ensureQueue, stopJobQueue } from '../../utils/job-queue'
import { PriceFile } from '../../models/price-files'
import { runCheck } from './check'

export interface CheckProgress { progress: number; stage: string }

const live = new Map<number, CheckProgress>()
const waiting: number[] = []
let running: Promise<void> | null = null

/** Progress of a check that is queued or running in this process. */
export function liveProgress(id: number): CheckProgress | undefined {
  return live.get(id)
}

/** Queues a check (the price file must already be in status `parsing`). */
export function enqueueCheck(id: number): void {
  if (isPostgres()) {
    sendCheck(id).catch((err) => console.error('[boreline] price file check not queued:', err?.message ?? err))
    return
  }
  if (live.has(id)) return
  live.set(id, { progress: 0, stage: 'queued' })
  waiting.push(id)
  if (!running) running = drain()
}

async function drain(): Promise<void> {
  try {
    while (waiting.length) {
      const id = waiting.shift()!
      try {
        await checkOne(id)
      } catch (err) {
        console.error('[boreline] price file check crashed:', err)
      }
    }
  } finally {
    running = null
  }
}

async function checkOne(id: number): Promise<void> {
  let written = 0
  let writtenStage = ''
  try {
    await runCheck(id, (stage, progress) => {
      const now = { stage, progress: Math.max(0, Math.min(100, Math.round(progress))) }
      live.set(id, now)
      if (!isPostgres() || (stage === writtenStage && Date.now() - written < PROGRESS_WRITE_MS)) return
      written = Date.now()
      writtenStage = stage
      PriceFile.update(now, { where: { id, status: 'parsing' } }).catch(() => { /* progress only: the next one tries again */ })
    })
  } finally {
    live.delete(id)
  }
}
const PROGRESS_WRITE_MS = 300

const CHECK_QUEUE = 'boreline-price-file-check'
let queueMade: ReturnType<typeof ensureQueue> | undefined

function checkQueue() {
  // a check cut short by a restart: its job expires and is taken again (runCheck skips a file no longer parsing)
  queueMade ??= ensureQueue(CHECK_QUEUE, { policy: 'standard', retryLimit: 3, expireInSeconds: 15 * 60 })
  queueMade.catch(() => { queueMade = undefined })
  return queueMade
}

async function sendCheck(id: number): Promise<void> {
  await (await checkQueue()).send(CHECK_QUEUE, { id }, { singletonKey: `price-file-${id}` })
}

/** On PostgreSQL: this process takes price-file checks from the shared queue, one at a time (a no-op on SQLite). */
export function startCheckWorker(nitro: NitroApp): void {
  if (!isPostgres()) return
  checkQueue()
    .then((boss) => boss.work<{ id: number }>(CHECK_QUEUE, { pollingIntervalSeconds: 0.5 }, async ([job]) => { if (job) await checkOne(job.data.id) }))
    .catch((err) => console.error('[boreline] price file checks not taken:', err?.message ?? err))
  nitro.hooks.hook('close', () => stopJobQueue())
}

const CUT_SHORT = 'The server stopped while this file was being applied; nothing was changed. Apply it again.'

/** At start: checks cut short by a restart run again; an apply cut short was rolled back by the database. */
export async function recoverPriceFiles(): Promise<void> {
  await recoverCutShortApplies()
  // PostgreSQL: another process may be checking right now; the shared queue takes interrupted checks again
  if (isPostgres()) return
  const interrupted = await PriceFile.findAll({ where: { status: 'parsing' }, attributes: ['id'], order: [['id', 'ASC']] })
  for (const priceFile of interrupted) enqueueCheck(priceFile.id)
}

/**
 * Files left "applying" by a process that stopped mid-apply go back to ready. On SQLite the one process is this
 * one, so every such file was cut short. On PostgreSQL an apply holds its file's row locked until it commits or
 * rolls back, and a process that dies loses its locks: a row still "applying" that can be locked without waiting
 * belongs to no running apply. Returns the files put back.
 */
export async function recoverCutShortApplies(): Promise<number[]> {
  return withWrite(async (t) => {
    const ids = isPostgres()
      ? (await getDb().query<{ id: number }>("SELECT id FROM price_files WHERE status = 'applying' FOR UPDATE SKIP LOCKED", { type: QueryTypes.SELECT, transaction: t })).map((r) => Number(r.id))
      : (await PriceFile.findAll({ where: { status: 'applying' }, attributes: ['id'], transaction: t })).map((r) => r.id)
    if (ids.length) await PriceFile.update({ status: 'ready', errorMessage: CUT_SHORT }, { where: { id: ids, status: 'applying' }, transaction: t })
    return ids
  })
}

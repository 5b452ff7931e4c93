/**
 * The queue of price-file checks in this process: one check at a time (a second file waits its turn: never two
 * checks interleaved, each would slow the other and both hold a snapshot), with the stage and progress of the one
 * running and of those waiting, for the pages that poll them. The queue lives in memory, so at start the files a
 * restart cut short are queued again.
 */
import { withWrite } from '../../utils/db'
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
        await runCheck(id, (stage, progress) => {
          live.set(id, { stage, progress: Math.max(0, Math.min(100, Math.round(progress))) })
        })
      } catch (err) {
        console.error('[boreline] price file check crashed:', err)
      } finally {
        live.delete(id)
      }
    }
  } finally {
    running = null
  }
}

/** At start: checks cut short by a restart run again; an apply cut short was rolled back by SQLite. */
export async function recoverPriceFiles(): Promise<void> {
  await withWrite((t) => PriceFile.update(
    { status: 'ready', errorMessage: 'The server stopped while this file was being applied; nothing was changed. Apply it again.' },
    { where: { status: 'applying' }, transaction: t },
  ))
  const interrupted = await PriceFile.findAll({ where: { status: 'parsing' }, attributes: ['id'], order: [['id', 'ASC']] })
  for (const priceFile of interrupted) enqueueCheck(priceFile.id)
}

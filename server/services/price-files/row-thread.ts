/**
 * Runs the reading and validating of a price file (CSV or XLSX) in a worker thread (rows-worker.ts, bundled beside the
 * server as `price-rows-worker.cjs`), so the server thread only compares: on this 2-core machine the two halves
 * of a 200,000-row check then run side by side. Where the bundle is not there (`nuxi dev`) or
 * `BORELINE_PRICE_WORKER=0`, the caller packs the rows on its own thread instead (same batches, same results).
 */
import { on } from 'node:events'
import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Worker } from 'node:worker_threads'
import { PriceFileError } from './file-rows'
import type { RowBatch, RowJob } from './row-batches'
import type { WorkerMessage } from './rows-worker'

export const ROWS_WORKER_FILE = 'price-rows-worker.cjs'
let located: string | null | undefined

/** The worker bundle beside the running server, or null (then rows are packed in-thread). */
export function rowsWorkerPath(): string | null {
  if (process.env.BORELINE_PRICE_WORKER === '0') return null
  if (located !== undefined) return located
  const dirs: string[] = []
  try {
    let d = dirname(fileURLToPath(import.meta.url))
    for (let k = 0; k < 4; k++) { dirs.push(d); d = dirname(d) }
  } catch { /* not a file URL */ }
  if (process.argv[1]) dirs.push(dirname(process.argv[1]))
  located = dirs.map((d) => join(d, ROWS_WORKER_FILE)).find((p) => existsSync(p)) ?? null
  return located
}

/** The packed batches of a price file, read and validated by a worker thread; stopping early ends the worker. */
export async function* workerBatches(file: string, job: RowJob): AsyncGenerator<RowBatch> {
  const worker = new Worker(file, { workerData: job })
  let exitCode = 0
  worker.once('exit', (code) => { exitCode = code })
  try {
    // messages in order; an 'error' event (the worker threw) rejects, 'exit' ends the loop
    for await (const [m] of on(worker, 'message', { close: ['exit'] }) as AsyncIterable<[WorkerMessage]>) {
      if (m.type === 'batch') yield m.batch
      else if (m.type === 'done') return
      else if (m.type === 'refused') throw new PriceFileError(m.message, m.code)
      else throw new Error(`the price rows worker failed: ${m.message}`)
    }
    throw new Error(exitCode ? `the price rows worker stopped (exit code ${exitCode})` : 'the price rows worker stopped before the end of the file')
  } finally {
    void worker.terminate()
  }
}

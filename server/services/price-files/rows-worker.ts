/**
 * The worker thread that reads and validates a price file (CSV with papaparse, XLSX with exceljs) while the server
 * thread compares
 * the rows with the catalogue: bundled on its own beside the server at build time (nuxt.config.ts, esbuild) as
 * `price-rows-worker.cjs`. It posts packed batches (row-batches.ts), their buffers transferred, then `done`; a
 * problem with the file is posted as `refused` with the message the person sees.
 */
import { setPriority } from 'node:os'
import { parentPort, workerData } from 'node:worker_threads'
import { PriceFileError } from './file-rows'
import { packedFile, transferables, type RowBatch, type RowJob } from './row-batches'

export type WorkerMessage =
  | { type: 'batch'; batch: RowBatch }
  | { type: 'done'; count: number }
  | { type: 'refused'; message: string; code: string }
  | { type: 'crashed'; message: string }

async function run(job: RowJob): Promise<void> {
  const port = parentPort!
  let count = 0
  try {
    for await (const batch of packedFile(job)) {
      count = batch.count
      port.postMessage({ type: 'batch', batch } satisfies WorkerMessage, transferables(batch))
    }
    port.postMessage({ type: 'done', count } satisfies WorkerMessage)
  } catch (err) {
    if (err instanceof PriceFileError) port.postMessage({ type: 'refused', message: err.message, code: err.code } satisfies WorkerMessage)
    else port.postMessage({ type: 'crashed', message: (err as Error)?.stack ?? String(err) } satisfies WorkerMessage)
  }
}

if (parentPort) {
  // On Linux a thread has its own nice value and setPriority(0, …) changes the calling thread only: the reading
  // yields the CPU to the server thread, so requests are answered first while a file is checked. Nice 5 (a third of
  // the server thread's share where both want one core) rather than 10 (a tenth): at 10 the collector's and
  // SQLite's threads starved it on two cores, and a 200,000-row check read its rows in 495-585 ms against 401-535 ms
  // at 5, with health answers during the check no slower (p99 43-87 ms either way; bench/README.md)
  try { setPriority(0, 5) } catch { /* not permitted here: run at the normal priority */ }
  void run(workerData as RowJob)
}

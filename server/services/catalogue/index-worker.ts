/**
 * The part-search index built in a thread of its own (bundled beside the server as `part-index-worker.cjs`, see
 * nuxt.config.ts): it reads every part, builds the index, saves it to the file it is given and ends, so the rows
 * read and the garbage of the build never sit in the server thread's heap, and the memory goes when the thread
 * ends. The server thread then loads the saved file (catalogue-index.ts). Plain Node.
 */
import { parentPort, workerData } from 'node:worker_threads'

export interface IndexJob { databaseUrl: string; path: string }
export type IndexWorkerMessage = { type: 'saved'; revision: number; parts: number } | { type: 'failed'; message: string }

async function main(): Promise<IndexWorkerMessage> {
  const job = workerData as IndexJob
  process.env.DATABASE_URL = job.databaseUrl
  const { closeDb, readWithoutMemoryMapping } = await import('../../utils/db')
  readWithoutMemoryMapping() // every part is read once: mapped pages would only add to the process's memory
  const { buildFromDatabase, catalogueRevision } = await import('./index-source')
  const { saveIndex } = await import('./saved-index')
  try {
    const revision = await catalogueRevision() // before the rows: a change while they are read is re-read later
    // the index is only saved here: its text indexes are filled one part type at a time as the file is written,
    // and each piece goes once written, so the thread never holds the whole index and its file's sections at once
    const index = await buildFromDatabase({ textLater: true })
    const parts = index.size
    saveIndex(index, revision, job.path, true)
    return { type: 'saved', revision, parts }
  } finally {
    // closed before the answer goes: the thread then ends on its own with nothing in flight (the sqlite3 driver
    // aborts the process when a thread is torn down while a close is pending)
    await closeDb()
  }
}

main().then(
  (m) => parentPort!.postMessage(m),
  (err: unknown) => parentPort!.postMessage({ type: 'failed', message: err instanceof Error ? err.message : String(err) } satisfies IndexWorkerMessage),
)

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { workerBatches } from '../../../server/services/price-files/row-thread'
import { PriceFileError } from '../../../server/services/price-files/file-rows'
import type { RowJob } from '../../../server/services/price-files/row-batches'

// Stand-in workers (plain CommonJS, as the bundled one is) that speak the same messages, to check how the server
// thread reads them: batches in order, then done; a refusal becomes the person's message; a crash or an early exit
// becomes an error, never a silently short file.
const dir = mkdtempSync(join(tmpdir(), 'boreline-row-thread-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

function workerFile(name: string, body: string): string {
  const path = join(dir, `${name}.cjs`)
  writeFileSync(path, `const { parentPort, workerData } = require('node:worker_threads')\n${body}\n`)
  return path
}
const batch = (n: number) => `{ type: 'batch', batch: { n: ${n}, count: ${n}, rows: new Int32Array(${n}), ok: new Uint8Array(${n}), nums: new Float64Array(${n} * 4), width: 4, stockCodes: [], skus: '', descs: null, types: null, refused: [], bytesRead: 0 } }`
const job = { path: '/nowhere.csv', delimiter: ',', afterRow: 1, headers: [], decimal: '.' } as unknown as RowJob

async function collect(file: string): Promise<number[]> {
  const sizes: number[] = []
  for await (const b of workerBatches(file, job)) sizes.push(b.n)
  return sizes
}

describe('reading rows in a worker thread', () => {
  it('yields the batches in order, then ends at done; the job reaches the worker', async () => {
    const file = workerFile('ok', `if (workerData.path !== '/nowhere.csv') throw new Error('no job'); for (const n of [1, 2, 3]) parentPort.postMessage(${batch('n')}); parentPort.postMessage({ type: 'done', count: 6 })`)
    expect(await collect(file)).toEqual([1, 2, 3])
  })

  it('turns a refusal into the message the person sees', async () => {
    const file = workerFile('refused', `parentPort.postMessage(${batch(2)}); parentPort.postMessage({ type: 'refused', message: 'The file cannot be read as CSV at row 3.', code: 'csv_syntax' })`)
    const err = await collect(file).catch((e) => e)
    expect(err).toBeInstanceOf(PriceFileError)
    expect(err).toMatchObject({ message: 'The file cannot be read as CSV at row 3.', code: 'csv_syntax' })
  })

  it('fails, not ends short, when the worker crashes, throws or exits before done', async () => {
    const crashed = workerFile('crashed', `parentPort.postMessage({ type: 'crashed', message: 'boom' })`)
    await expect(collect(crashed)).rejects.toThrow(/worker failed: boom/)
    const threw = workerFile('threw', `parentPort.postMessage(${batch(1)}); throw new Error('unexpected')`)
    await expect(collect(threw)).rejects.toThrow(/unexpected/)
    const quiet = workerFile('quiet', `parentPort.postMessage(${batch(1)})`)
    await expect(collect(quiet)).rejects.toThrow(/stopped before the end of the file/)
  })

  it('ends the worker when the reader stops early', async () => {
    const file = workerFile('endless', `let n = 0; const t = setInterval(() => parentPort.postMessage(${batch(1)}), 5)`)
    const it = workerBatches(file, job)
    expect((await it.next()).value?.n).toBe(1)
    await it.return(undefined) // the finally block terminates the worker; the test would hang on an open handle otherwise
    expect((await it.next()).done).toBe(true)
  })
})

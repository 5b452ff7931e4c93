/**
 * A second server process on the e2e run's database (PostgreSQL), for the tests in tests/processes/: started from
 * the same build with the same settings as the run's server (tests/support/global-setup.ts), on a free port.
 */
import { spawn } from 'node:child_process'
import { afterAll, beforeAll, expect } from 'vitest'
import { join, resolve } from 'node:path'
import { Client, env } from './api'
import { freePort } from './global-setup'
import { serverNodeArgs } from '../../scripts/server-process.mjs'

const outDir = process.env.BORELINE_BUILD_DIR ? join(resolve(process.env.BORELINE_BUILD_DIR), '.output') : resolve(import.meta.dirname, '../../.output')

/** Starts the second process and waits until it answers; `stop()` ends it. */
export async function startSecondProcess(): Promise<{ base: string; stop: () => void }> {
  const port = await freePort()
  const base = `http://127.0.0.1:${port}`
  let out = ''
  const second = spawn(process.execPath, [...serverNodeArgs(), join(outDir, 'server/index.mjs')], {
    env: { ...process.env, ...env().serverEnv, PORT: String(port) },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  second.stdout!.on('data', (d) => { out = (out + d).slice(-8_000) })
  second.stderr!.on('data', (d) => { out = (out + d).slice(-8_000) })
  const until = Date.now() + 60_000
  for (;;) {
    try { if ((await fetch(`${base}/api/health`)).ok) break } catch { /* starting */ }
    if (Date.now() > until || second.exitCode !== null) throw new Error(`the second process did not start:\n${out}`)
    await new Promise((r) => setTimeout(r, 250))
  }
  return { base, stop: () => { second.kill('SIGTERM') } }
}

/**
 * For a test file: the run's server (`a`) and a second process on the same PostgreSQL database (`b`), started before
 * the file's tests and stopped after them.
 */
export function useTwoProcesses(): { a: string; b: string } {
  const bases = { a: '', b: '' }
  let stop = () => {}
  beforeAll(async () => {
    expect(env().databaseUrl).toMatch(/^postgres/)
    bases.a = env().baseUrl
    const second = await startSecondProcess()
    bases.b = second.base
    stop = second.stop
  }, 90_000)
  afterAll(() => { stop() })
  return bases
}

/** The same session, sent to another process. */
export function through(base: string, c: Client): Client {
  const copy = new Client(base)
  copy.cookies = c.cookies // shared: a cookie set by either process counts for both
  return copy
}

/**
 * The national-catalogue targets in one run: `bench/catalogue.ts` at 200k parts and at 1M parts (2.5M fitments), then
 * `bench/price-files.ts`, one after the other on the same build, and a table of every target side by side with the
 * ceilings and floors each run measured beside it. Each run's whole output is kept in --logs.
 *
 *   BORELINE_BUILD_DIR=/tmp/build-x npx tsx bench/national.ts [--duration 60] [--db200k <file>] [--db1m <file>]
 *                                                            [--logs <dir>] [--skip-prices]
 *
 * The databases are made by the catalogue benchmark when missing (a few minutes at 1M). Ports come from the
 * environment as the two benchmarks take them (PORT, MAIL_FAKE_SMTP_PORT, MAIL_FAKE_HTTP_PORT). About 25 minutes on
 * 2 cores; keep the machine otherwise quiet.
 */
import { spawn } from 'node:child_process'
import { createWriteStream, mkdirSync } from 'node:fs'
import os from 'node:os'
import { join, resolve } from 'node:path'

const root = resolve(import.meta.dirname, '..')
const arg = (name: string, fallback: string) => { const i = process.argv.indexOf(`--${name}`); return i > 0 ? process.argv[i + 1]! : fallback }
const duration = arg('duration', '60')
const logs = resolve(arg('logs', join(os.tmpdir(), `boreline-national-${Date.now()}`)))
mkdirSync(logs, { recursive: true })

/** Runs one benchmark, its output both shown and kept; resolves with the output. */
function run(name: string, args: string[]): Promise<string> {
  const file = join(logs, `${name}.log`)
  const out = createWriteStream(file)
  let text = ''
  console.log(`\n=== ${name}: npx tsx ${args.join(' ')} (output kept in ${file})`)
  return new Promise((res, rej) => {
    const child = spawn('npx', ['tsx', ...args], { cwd: root, env: process.env, stdio: ['ignore', 'pipe', 'pipe'] })
    for (const stream of [child.stdout, child.stderr]) {
      stream.on('data', (b: Buffer) => { text += b.toString(); out.write(b); process.stdout.write(b) })
    }
    child.on('exit', (code) => {
      out.end()
      if (code === 0) res(text)
      else rej(new Error(`${name} ended with ${code}; see ${file}`))
    })
  })
}

/** The cells of the markdown table row whose first cell starts with `first`. */
function rowOf(text: string, first: string): string[] {
  const line = text.split('\n').find((l) => l.startsWith(`| ${first}`))
  return line ? line.split('|').slice(1, -1).map((c) => c.trim()) : []
}
const after = (text: string, prefix: string) => text.split('\n').find((l) => l.startsWith(prefix))?.slice(prefix.length).trim() ?? '?'

interface Catalogue { vehicleParts: string; ceiling: string; drift: string; search: string; slips: string; kinds: string; indexReady: string; rss: string; rssBuilt: string; load: string }
function catalogueFigures(text: string): Catalogue {
  const cached = rowOf(text, 'GET /api/vehicles/:id/parts, cached')
  const ceiling = rowOf(text, 'constant JSON')
  const signedIn = text.split('\n').filter((l) => l.startsWith('| constant JSON')).map((l) => l.split('|').slice(1, -1).map((c) => c.trim()))[1] ?? ceiling
  const inproc = rowOf(text, 'minisearch plan + index, in process')
  const startup = (name: string) => rowOf(text, name)[1] ?? '?'
  return {
    vehicleParts: `${cached[1] ?? '?'} req/s, p99 ${cached[3] ?? '?'}`,
    ceiling: `${signedIn[1] ?? '?'} req/s, p99 ${signedIn[3] ?? '?'}`,
    drift: after(text, 'cached run, second by second:'),
    search: `p95 ${inproc[2] ?? '?'}`,
    slips: `${after(text, 'SKU with one slip in the first 20 (target >= 95 %):')} (${after(text, '  of them, ')})`,
    kinds: after(text, 'found by kind: minisearch').split('; FTS5')[0] ?? '?',
    indexReady: startup('until the search index answers, loaded from its saved file'),
    rss: startup('RSS when ready / after the load runs / peak, index loaded'),
    rssBuilt: startup('RSS when ready / peak, index built and saved'),
    load: after(text, 'Load average (1, 5, 15 min):'),
  }
}

async function main(): Promise<void> {
  const small = catalogueFigures(await run('catalogue-200k', ['bench/catalogue.ts', '--duration', duration,
    '--database', arg('db200k', join(os.tmpdir(), 'boreline-national-200k.db'))]))
  const large = catalogueFigures(await run('catalogue-1m', ['bench/catalogue.ts', '--duration', duration,
    '--database', arg('db1m', join(os.tmpdir(), 'boreline-national-1m.db')), '--parts', '1000000', '--vehicles', '50000', '--fitments', '2500000']))
  const prices = process.argv.includes('--skip-prices') ? '' : await run('price-files', ['bench/price-files.ts'])
  const a = rowOf(prices, 'A: 200k new parts')
  const row = (name: string, target: string, pick: (c: Catalogue) => string) => `| ${name} | ${pick(small)} | ${pick(large)} | ${target} |`
  console.log(`
## National-catalogue targets, one run (${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC, ${duration} s loads, logs in ${logs})

| figure | 200k parts | 1M parts (2.5M fitments) | target |
|---|---|---|---|
${row('vehicle parts, 50 connections', 'p99 < 40 ms', (c) => c.vehicleParts)}
${row('same run, constant JSON signed in (ceiling)', '-', (c) => c.ceiling)}
${row('drift over the vehicle-parts run', 'none', (c) => c.drift)}
${row('search in process', 'p95 < 25 ms at 1M', (c) => c.search)}
${row('SKU with one slip in the first 20', '>= 95 %', (c) => c.slips)}
${row('every kind of query, expected part in the first 20', 'kept', (c) => c.kinds)}
${row('until the search index answers (saved file)', '< 15 s at 1M', (c) => c.indexReady)}
${row('RSS ready / after loads / peak (index loaded)', '< 1.2 GB at 1M', (c) => c.rss)}
${row('RSS ready / peak (index built, no saved file)', '-', (c) => c.rssBuilt)}
${row('load average at the start, at the end', '-', (c) => c.load)}
${prices ? `| price file A (200k new parts): preview + apply / \`.import\` | ${a[6] ?? '?'} / ${a[7] ?? '?'} = ${a[8] ?? '?'} | - | <= 6x |` : ''}
${prices ? `\nprice files: ${after(prices, 'targets:')}` : ''}
`)
}

main().then(() => process.exit(0), (err) => { console.error(err); process.exit(1) })

/**
 * The national-catalogue targets in one run: `bench/catalogue.ts` at 200k parts and at 1M parts (2.5M fitments), then
 * `bench/price-files.ts`, one after the other on the same build, and a table of every target side by side with the
 * ceilings and floors each run measured beside it. Each run's whole output is kept in --logs, with the figures it
 * wrote as JSON (BENCH_SUMMARY), which the table here is made from.
 *
 *   BORELINE_BUILD_DIR=/tmp/build-x npx tsx bench/national.ts [--duration 60] [--db200k <file>] [--db1m <file>]
 *                                                            [--logs <dir>] [--skip-prices]
 *
 * The databases are made by the catalogue benchmark when missing (a few minutes at 1M). Ports come from the
 * environment as the two benchmarks take them (PORT, MAIL_FAKE_SMTP_PORT, MAIL_FAKE_HTTP_PORT). About 25 minutes on
 * 2 cores; keep the machine otherwise quiet.
 */
import { spawn } from 'node:child_process'
import { createWriteStream, mkdirSync, readFileSync } from 'node:fs'
import os from 'node:os'
import { join, resolve } from 'node:path'
import type { CatalogueSummary } from './catalogue'
import type { PriceFileFigures, PriceFilesSummary } from './price-files'

const root = resolve(import.meta.dirname, '..')
const arg = (name: string, fallback: string) => { const i = process.argv.indexOf(`--${name}`); return i > 0 ? process.argv[i + 1]! : fallback }
const duration = arg('duration', '60')
const logs = resolve(arg('logs', join(os.tmpdir(), `boreline-national-${Date.now()}`)))
mkdirSync(logs, { recursive: true })

/** Runs one benchmark, its output shown and kept; resolves with the figures it wrote to BENCH_SUMMARY (JSON). */
function run<T>(name: string, args: string[]): Promise<T> {
  const file = join(logs, `${name}.log`), summary = join(logs, `${name}.json`)
  const out = createWriteStream(file)
  console.log(`\n=== ${name}: npx tsx ${args.join(' ')} (output kept in ${file})`)
  return new Promise((res, rej) => {
    const child = spawn('npx', ['tsx', ...args], { cwd: root, env: { ...process.env, BENCH_SUMMARY: summary }, stdio: ['ignore', 'pipe', 'pipe'] })
    for (const stream of [child.stdout, child.stderr]) {
      stream.on('data', (b: Buffer) => { out.write(b); process.stdout.write(b) })
    }
    child.on('exit', (code) => {
      out.end()
      if (code !== 0) return rej(new Error(`${name} ended with ${code}; see ${file}`))
      try { res(JSON.parse(readFileSync(summary, 'utf8')) as T) } catch (err) { rej(new Error(`${name} wrote no figures to ${summary}: ${(err as Error).message}`)) }
    })
  })
}

const ms = (x: number) => `${x.toFixed(x < 10 ? 1 : 0)} ms`
const s1 = (x: number) => `${x.toFixed(1)} s`
const mb = (x: number) => x.toFixed(0)
const rps = (x: number) => x.toFixed(0)

async function main(): Promise<void> {
  const small = await run<CatalogueSummary>('catalogue-200k', ['bench/catalogue.ts', '--duration', duration,
    '--database', arg('db200k', join(os.tmpdir(), 'boreline-national-200k.db'))])
  const large = await run<CatalogueSummary>('catalogue-1m', ['bench/catalogue.ts', '--duration', duration,
    '--database', arg('db1m', join(os.tmpdir(), 'boreline-national-1m.db')), '--parts', '1000000', '--vehicles', '50000', '--fitments', '2500000'])
  const prices = process.argv.includes('--skip-prices') ? null : await run<PriceFilesSummary>('price-files', ['bench/price-files.ts'])
  const row = (name: string, target: string, pick: (c: CatalogueSummary) => string) => `| ${name} | ${pick(small)} | ${pick(large)} | ${target} |`
  const file = (f: PriceFileFigures) => `${s1(f.previewPlusApplyS)} / ${f.importS.toFixed(2)} s = ${f.ratio.toFixed(1)}x (health p99 ${ms(f.healthP99Ms)})`
  console.log(`
## National-catalogue targets, one run (${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC, ${duration} s loads, logs in ${logs})

| figure | 200k parts | 1M parts (2.5M fitments) | target |
|---|---|---|---|
${row('vehicle parts, 50 connections', 'p99 < 40 ms', (c) => `${rps(c.vehicleParts.rps)} req/s, p99 ${ms(c.vehicleParts.p99Ms)}`)}
${row('same run, constant JSON signed in (ceiling)', '-', (c) => `${rps(c.ceilingSignedIn.rps)} req/s, p99 ${ms(c.ceilingSignedIn.p99Ms)}`)}
${row('drift over the vehicle-parts run', 'none', (c) => c.drift)}
${row('search in process, p95 (end to end)', 'p95 < 25 ms at 1M', (c) => `${ms(c.searchP95Ms.inProcess)} (${ms(c.searchP95Ms.endToEnd)})`)}
${row('SKU with one slip in the first 20', '>= 95 %', (c) => `${c.slips.found} (${c.slips.real} of ${c.slips.of} slips make another part's number: ${c.slips.realFound} of those found; the others ${c.slips.otherFound})`)}
${row('every kind of query, expected part in the first 20', 'kept', (c) => c.foundByKind)}
${row('until the search index answers (saved file)', '< 15 s at 1M', (c) => s1(c.indexReadyS))}
${row('RSS ready / after loads / peak (index loaded)', '< 1.2 GB at 1M', (c) => `${mb(c.rssMb.ready)} / ${mb(c.rssMb.afterLoads)} / ${mb(c.rssMb.peak)} MB`)}
${row('first start, no saved file: index answers, RSS ready / peak', '-', (c) => `${s1(c.builtWithoutFile.indexReadyS)}, ${mb(c.builtWithoutFile.rssReadyMb)} / ${mb(c.builtWithoutFile.peakMb)} MB`)}
${row('load average at the start, at the end', '-', (c) => `${c.load.start}; ${c.load.end}`)}
${prices ? `| price file A (200k new parts): preview + apply / \`.import\` | ${file(prices.a)} | - | <= 6x |
| price file B (200k changed, median of ${prices.b.runs}) | ${file(prices.b)} | - | <= 6x |
| price files: server peak memory | ${mb(prices.peakMb)} MB | - | < 500 MB |` : ''}
`)
}

main().then(() => process.exit(0), (err) => { console.error(err); process.exit(1) })

/**
 * npm test: every project on the default SQLite database; then, when BORELINE_TEST_PG_URL names a PostgreSQL
 * server, the e2e project again on a fresh PostgreSQL database and the two-process suite, reusing the build of
 * the first run (one build, one server at a time). Extra arguments go to the first run only.
 * Reports: test-results/vitest.json (SQLite) and test-results/vitest-pg.json (PostgreSQL).
 */
import { spawnSync } from 'node:child_process'

const vitest = (args, env = process.env) => spawnSync('npx', ['vitest', 'run', ...args], { stdio: 'inherit', env }).status ?? 1

const first = vitest(process.argv.slice(2))
if (!process.env.BORELINE_TEST_PG_URL || process.argv.length > 2) process.exit(first)

console.log('\n[test] the e2e project and the two-process suite on PostgreSQL…')
const started = Date.now()
const second = vitest(['--project', 'e2e', '--project', 'processes'], {
  ...process.env, BORELINE_E2E_DATABASE: 'postgres', BORELINE_REBUILD: '', BORELINE_VITEST_REPORT: 'test-results/vitest-pg.json',
})
console.log(`[test] PostgreSQL run: ${((Date.now() - started) / 60_000).toFixed(1)} min`)
process.exit(first || second)

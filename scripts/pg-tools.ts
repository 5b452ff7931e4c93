/**
 * Backup and restore on PostgreSQL, with PostgreSQL's own tools: `pg_dump --format=custom` (a consistent snapshot
 * of a running database) and `pg_restore --clean`. When they are not installed, says so and how to get them.
 */
import { spawnSync } from 'node:child_process'

function haveTool(tool: string): boolean {
  return spawnSync(tool, ['--version'], { encoding: 'utf8' }).status === 0
}

function run(tool: string, args: string[]): void {
  if (!haveTool(tool)) {
    console.error(`${tool} is not installed here. Install PostgreSQL's client tools (Debian: apt-get install -y postgresql-client) and run this again.`)
    process.exit(1)
  }
  const r = spawnSync(tool, args, { stdio: 'inherit' })
  if (r.status !== 0) {
    console.error(`${tool} failed (exit ${r.status ?? r.signal}).`)
    process.exit(1)
  }
}

/** Writes a custom-format dump of the database `url` to `dest`. */
export function pgBackup(url: string, dest: string): void {
  run('pg_dump', ['--format=custom', '--no-owner', `--file=${dest}`, `--dbname=${url}`])
  console.log(`Backed up the PostgreSQL database -> ${dest} (pg_dump, custom format)`)
}

/** Replaces the database `url`'s objects with those of the dump `src`. */
export function pgRestore(url: string, src: string): void {
  run('pg_restore', ['--clean', '--if-exists', '--no-owner', '--single-transaction', `--dbname=${url}`, src])
  console.log(`Restored ${src} -> the PostgreSQL database (pg_restore)`)
}

process.env.DATABASE_URL = 'sqlite:/tmp/pl-run/stage-bench.sqlite'
import { rmSync } from 'node:fs'
rmSync('/tmp/pl-run/stage-bench.sqlite', { force: true }); rmSync('/tmp/pl-run/stage-bench.sqlite-wal', { force: true })
const { getDb, withWrite } = await import('../server/utils/db')
const { migrateUp } = await import('../server/utils/migrate')
await migrateUp(getDb())
await getDb().query(`INSERT INTO organisations (kind, name, status, created_at, updated_at) VALUES ('distributor','x','approved',datetime(),datetime())`)
await getDb().query(`INSERT INTO users (organisation_id, email, name, role, created_at, updated_at) VALUES (1,'a@b','x','counter_staff',datetime(),datetime())`)
await getDb().query(`INSERT INTO price_uploads (status, file_name, file_size, file_format, created_by_user_id, created_at, updated_at) VALUES ('parsing','x',1,'csv',1,datetime(),datetime())`)
async function time(label: string, fn: () => Promise<void>) { const t = performance.now(); await fn(); console.log(label, Math.round(performance.now() - t), 'ms') }
const row = (i: number) => ['changed', i, `SYN-${i}`, i, null, null, 100, 200, 50, 60, 0, 0, 1, 1, 2.5, 0, '{"NGT":3,"RVS":2}', null, null, null]
const COLS = `(upload_id, kind, row_number, sku, part_id, part_type, description, old_list_minor, new_list_minor, old_trade_minor, new_trade_minor, old_core_minor, new_core_minor, old_pack, new_pack, change_pct, large, stock, columns, reason, raw)`
async function json(perTx: number) { for (let b = 0; b < 40000 / perTx; b++) { const batch = Array.from({ length: perTx }, (_, i) => row(b * perTx + i)); await withWrite((t) => getDb().query(`INSERT INTO price_upload_rows ${COLS} SELECT 1, v->>0, v->>1, v->>2, v->>3, v->>4, v->>5, v->>6, v->>7, v->>8, v->>9, v->>10, v->>11, v->>12, v->>13, v->>14, v->>15, v->>16, v->>17, v->>18, v->>19 FROM (SELECT value AS v FROM json_each($1))`, { bind: [JSON.stringify(batch)], transaction: t })) } }
for (const n of [2000, 2000]) await time(`json ${n}/tx`, () => json(n))
async function jsonOpts(perTx: number, pragma: string) { for (let b = 0; b < 40000 / perTx; b++) { const batch = Array.from({ length: perTx }, (_, i) => row(b * perTx + i)); await withWrite(async (t) => { const conn = (t as any).connection; await new Promise<void>((res, rej) => conn.exec(pragma, (e: Error | null) => (e ? rej(e) : res()))); await getDb().query(`INSERT INTO price_upload_rows ${COLS} SELECT 1, v->>0, v->>1, v->>2, v->>3, v->>4, v->>5, v->>6, v->>7, v->>8, v->>9, v->>10, v->>11, v->>12, v->>13, v->>14, v->>15, v->>16, v->>17, v->>18, v->>19 FROM (SELECT value AS v FROM json_each($1))`, { bind: [JSON.stringify(batch)], transaction: t }) }) } }
await time('json 2000/tx no autocheckpoint', () => jsonOpts(2000, 'PRAGMA wal_autocheckpoint=0'))
await time('json 2000/tx no autocheckpoint', () => jsonOpts(2000, 'PRAGMA wal_autocheckpoint=0'))
await time(`json 2000/tx`, () => json(2000))

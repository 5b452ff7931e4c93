import { createReadStream, writeFileSync } from 'node:fs'
import { parse } from 'csv-parse'
import { emptyMapping, columnIndex } from '/work/main/server/services/price-lists/mapping'
import { rowValidator } from '/work/main/server/services/price-lists/rows'
const lines = ['sku,description,type,list_price,trade_cost,core_deposit,pack_quantity,stock_NGT,stock_RVS']
for (let i = 1; i <= 200000; i++) lines.push(`SYN-${String(i).padStart(6, '0')},Synthetic pad set ${i},pad_set,${(1000 + i % 400) / 100},${(600 + i % 300) / 100},0.00,1,${i % 37},${i % 11}`)
writeFileSync('/tmp/pl-run/work/m.csv', lines.join('\n'))
async function time(label: string, fn: () => Promise<void>) { const t = performance.now(); await fn(); console.log(label, Math.round(performance.now() - t), 'ms') }
await time('csv-parse info', async () => { const p = createReadStream('/tmp/pl-run/work/m.csv').pipe(parse({ info: true, relax_column_count: true, relax_quotes: true, trim: true })); let n = 0; for await (const r of p) n++ })
await time('csv-parse plain', async () => { const p = createReadStream('/tmp/pl-run/work/m.csv').pipe(parse({ relax_column_count: true, relax_quotes: true })); let n = 0; for await (const r of p) n++ })
await time('csv-parse plain trim', async () => { const p = createReadStream('/tmp/pl-run/work/m.csv').pipe(parse({ relax_column_count: true, relax_quotes: true, trim: true })); let n = 0; for await (const r of p) n++ })
const headers = lines[0]!.split(',')
const m = { ...emptyMapping(), sku: 'sku', description: 'description', type: 'type', listPrice: 'list_price', tradeCost: 'trade_cost', coreDeposit: 'core_deposit', packQuantity: 'pack_quantity', stock: { NGT: 'stock_NGT', RVS: 'stock_RVS' } }
const v = rowValidator(m, columnIndex(m, headers), '.')
const rows = lines.slice(1).map((l) => l.split(','))
await time('zod validate', async () => { for (const r of rows) v.validate(r) })
await time('json stringify 200k staged', async () => { for (let b = 0; b < 100; b++) { const batch = []; for (let i = 0; i < 2000; i++) batch.push(['changed', i, 'SYN-000001', 5, null, null, 100, 200, 50, 60, 0, 0, 1, 1, 2.5, 0, '{"NGT":3,"RVS":2}', null, null, null]); JSON.stringify(batch) } })

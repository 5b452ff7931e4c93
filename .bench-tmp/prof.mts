import { emptyMapping, columnIndex } from '../server/services/price-lists/mapping'
import { rowValidator } from '../server/services/price-lists/rows'
const N = 200000
const rows: string[][] = []
for (let i = 1; i <= N; i++) rows.push([`SYN-${String(i).padStart(6, '0')}`, `Synthetic pad set ${i}`, 'pad_set', `${(1000 + i % 400) / 100}`, `${(600 + i % 300) / 100}`, '0.00', '1', `${i % 37}`, `${i % 11}`])
const headers = ['sku', 'description', 'type', 'list_price', 'trade_cost', 'core_deposit', 'pack_quantity', 'stock_NGT', 'stock_RVS']
const m = { ...emptyMapping(), sku: 'sku', description: 'description', type: 'type', listPrice: 'list_price', tradeCost: 'trade_cost', coreDeposit: 'core_deposit', packQuantity: 'pack_quantity', stock: { NGT: 'stock_NGT', RVS: 'stock_RVS' } }
const v = rowValidator(m, columnIndex(m, headers), '.')
for (let k = 0; k < 3; k++) { const t = performance.now(); for (const r of rows) v.validate(r); console.log(Math.round(performance.now() - t)) }

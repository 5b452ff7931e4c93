import { z } from 'zod'
import { emptyMapping, columnIndex } from '../server/services/price-lists/mapping'
import { rowValidator } from '../server/services/price-lists/rows'
const N = 50000
const rows: string[][] = []
for (let i = 1; i <= N; i++) rows.push([`SYN-${String(i).padStart(6, '0')}`, `Synthetic pad set ${i}`, 'pad_set', `${(1000 + i % 400) / 100}`, `${(600 + i % 300) / 100}`, '0.00', '1', `${i % 37}`, `${i % 11}`])
const headers = ['sku', 'description', 'type', 'list_price', 'trade_cost', 'core_deposit', 'pack_quantity', 'stock_NGT', 'stock_RVS']
const m = { ...emptyMapping(), sku: 'sku', description: 'description', type: 'type', listPrice: 'list_price', tradeCost: 'trade_cost', coreDeposit: 'core_deposit', packQuantity: 'pack_quantity', stock: { NGT: 'stock_NGT', RVS: 'stock_RVS' } }
const v = rowValidator(m, columnIndex(m, headers), '.')
function time(label: string, fn: () => void) { fn(); const t = performance.now(); fn(); console.log(label, Math.round(performance.now() - t), 'ms per', N) }
time('current', () => { for (const r of rows) v.validate(r) })
const money = z.string().regex(/^\d{1,12}(?:\.\d{1,2})?$/)
const S = z.object({ sku: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9._/-]{1,39}$/), description: z.string().max(300).regex(/^(?![=+@\t\r-])/), type: z.enum(['pad_set', 'disc']), listPrice: money, tradeCost: money, coreDeposit: money, packQuantity: z.string().regex(/^\d{1,6}$/), s1: z.string().regex(/^\d{1,9}$/), s2: z.string().regex(/^\d{1,9}$/) })
time('regex object', () => { for (const r of rows) S.safeParse({ sku: r[0], description: r[1], type: r[2], listPrice: r[3], tradeCost: r[4], coreDeposit: r[5], packQuantity: r[6], s1: r[7], s2: r[8] }) })
const T = z.tuple([z.string().regex(/^[A-Za-z0-9][A-Za-z0-9._/-]{1,39}$/), z.string().max(300), z.string(), money, money, money, z.string().regex(/^\d{1,6}$/), z.string().regex(/^\d{1,9}$/), z.string().regex(/^\d{1,9}$/)])
time('regex tuple', () => { for (const r of rows) T.safeParse(r) })
const ts = z.string().transform((s, ctx) => { if (!/^\d{1,12}(?:\.\d{1,2})?$/.test(s)) { ctx.addIssue({ code: 'custom', message: 'x' }); return z.NEVER } return 1 })
const S2 = z.object({ a: ts, b: ts, c: ts, d: ts, e: ts, f: ts, g: ts, h: ts, i: ts })
time('transform object', () => { for (const r of rows) S2.safeParse({ a: r[3], b: r[4], c: r[5], d: r[3], e: r[4], f: r[5], g: r[7], h: r[8], i: r[6] }) })

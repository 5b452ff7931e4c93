import { z } from 'zod'
import { parseMoneyToMinor } from '../shared/utils/money'
const N = 200000
const rows: string[][] = []
for (let i = 1; i <= N; i++) rows.push([`SYN-${String(i).padStart(6, '0')}`, `Synthetic pad set ${i}`, 'pad_set', `${(1000 + i % 400) / 100}`, `${(600 + i % 300) / 100}`, '0.00', '1', `${i % 37}`, `${i % 11}`])
const positions: [string, number][] = [['sku', 0], ['description', 1], ['type', 2], ['listPrice', 3], ['tradeCost', 4], ['coreDeposit', 5], ['packQuantity', 6], ['stock_NGT', 7], ['stock_RVS', 8]]
const TYPES = ['pad_set', 'disc', 'drum', 'shoe_set', 'caliper', 'wheel_cylinder', 'master_cylinder', 'hose', 'fluid', 'fitting_kit', 'wear_sensor'] as const
const money = /^(?!0+(?:[.,]0*)?$)\d{1,12}(?:\.\d{1,2})?$/
const opt = /^(?:$|\d{1,12}(?:\.\d{1,2})?)$/
const S = z.object({ sku: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9._/-]{1,39}$/), listPrice: z.string().regex(money), description: z.string().max(300).regex(/^(?![=+@\t\r]|-[^\d\s])/), tradeCost: z.string().regex(opt), coreDeposit: z.string().regex(opt), packQuantity: z.string().regex(/^(?:|[1-9]\d{0,4}|100000)$/), stock_NGT: z.string().regex(/^(?:|\d{1,7}|10000000)$/), stock_RVS: z.string().regex(/^(?:|\d{1,7}|10000000)$/), type: z.enum(['', ...TYPES]) })
const T = new Map<string, string>(TYPES.map((t) => [t, t]))
const key = (h: string) => h.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '_').replace(/^_+|_+$/g, '')
function time(label: string, fn: () => void) { fn(); const t = performance.now(); fn(); console.log(label, Math.round(performance.now() - t), 'ms') }
time('input+trim', () => { for (const c of rows) { const input: Record<string, string> = {}; for (const [k, i] of positions) input[k] = (c[i] ?? '').trim() } })
time('+type key', () => { for (const c of rows) { const input: Record<string, string> = {}; for (const [k, i] of positions) input[k] = (c[i] ?? '').trim(); input.type = T.get(key(input.type!)) ?? input.type! } })
time('+desc ws', () => { for (const c of rows) { const input: Record<string, string> = {}; for (const [k, i] of positions) input[k] = (c[i] ?? '').trim(); input.description = input.description!.replace(/\s+/g, ' ') } })
time('+parse', () => { for (const c of rows) { const input: Record<string, string> = {}; for (const [k, i] of positions) input[k] = (c[i] ?? '').trim(); S.safeParse(input) } })
time('money x3', () => { for (const c of rows) { parseMoneyToMinor(c[3]!); parseMoneyToMinor(c[4]!); parseMoneyToMinor(c[5]!) } })

/**
 * GET /api/vehicles/:id/parts: the parts that fit one vehicle, grouped by axle and part type, narrowed by the
 * option answers, with the questions still open.
 *
 * The catalogue changes rarely and this is the garage's most frequent request, so it is cached at two levels:
 * - per vehicle and price-list version: the fitment rows, prices and stock read from the database (a few raw
 *   queries);
 * - per vehicle, price-list version, price view (staff / tier discount / none) and answers: the finished JSON bytes.
 * Both are dropped when the catalogue or stock revision moves (changes.ts, triggers of migration 0004); a new
 * price-list version gets new keys by itself; {@link STOCK_TTL_MS} is only a safety net. Plain Node.
 */
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import { PART_TYPES, PART_TYPE_LABELS, type PartType } from '../../../shared/schemas/catalogue/part-types'
import {
  answerFor, answerProblems, canonicalAnswers, IDENTITY_LABELS, matchQualifiers, openQuestions, type Answers, type OptionQuestion, type Qualifiers,
} from '../../../shared/utils/catalogue/qualifiers'
import { priceFields, viewKey, type PricingContext, type StoredPrice } from './pricing'
import { vehicleDetail, type VehicleDetail } from './vehicles'
import type { FitmentAxle } from '../../../shared/types/axles'
import { invalidInput } from '../errors'

export const STOCK_TTL_MS = 10 * 60_000
const MAX_BASES = 5_000
const MAX_RESPONSES = 10_000

interface Row {
  fitmentId: number; partId: number; sku: string; type: PartType; productLine: string; description: string
  specs: Record<string, unknown>; axle: FitmentAxle; side: string; quantity: number
  qualifiers: Qualifiers; note: string; price: StoredPrice | null; stock: { branchCode: string; quantity: number }[]
  replaces: string[]; oeDifferences: OeDifference[]
}
export interface OeDifference { field: string; label: string; oe: number | number[]; part: number | number[]; unit: 'mm' }

interface Base { builtAt: number; vehicle: VehicleDetail; options: OptionQuestion[]; rows: Row[]; priceVersion: number | null }

const bases = new Map<string, Promise<Base | null>>()
/** BORELINE_CATALOGUE_CACHE=0 turns both caches off (the benchmark measures the uncached path with it). */
let cacheFlag: boolean | undefined
const cacheOn = () => (cacheFlag ??= process.env.BORELINE_CATALOGUE_CACHE !== '0')
const responses = new Map<string, { builtAt: number; body: Buffer }>()

/** Drops every cached list (any catalogue change). */
export function clearVehiclePartsCache(): void {
  bases.clear()
  responses.clear()
}

export function vehiclePartsCacheStats() { return { bases: bases.size, responses: responses.size } }

const parse = <T>(s: string | null, fallback: T): T => { try { return s == null ? fallback : JSON.parse(s) as T } catch { return fallback } }

/** Where a part differs from the vehicle's original equipment on that axle (bores, pistons, disc/drum size). */
export function oeDifferencesOf(type: PartType, specs: Record<string, unknown>, axle: string, qualifiers: Qualifiers, vehicle: Pick<VehicleDetail, 'mcBoreMm' | 'brakes'>): OeDifference[] {
  const num = (v: unknown) => (typeof v === 'number' ? v : null)
  if (type === 'master_cylinder') {
    const oe = num(vehicle.mcBoreMm), part = num(specs.boreMm)
    return oe !== null && part !== null && Math.abs(oe - part) > 0.01 ? [{ field: 'boreMm', label: 'master cylinder bore', oe, part, unit: 'mm' }] : []
  }
  const brakes = vehicle.brakes.filter((b) => b.axle === axle && matchQualifiers(b.qualifiers, qualifiers) !== 'excluded')
  const differs = (pick: (b: VehicleDetail['brakes'][number]) => number | number[] | null | undefined, part: number | number[] | null, field: string, label: string): OeDifference[] => {
    if (part === null) return []
    const candidates = brakes.map(pick).filter((x): x is number | number[] => x != null)
    if (!candidates.length) return []
    const eq = (a: number | number[], b: number | number[]) => JSON.stringify(a) === JSON.stringify(b)
    if (candidates.some((c) => eq(c, part))) return []
    return [{ field, label, oe: candidates[0]!, part, unit: 'mm' }]
  }
  switch (type) {
    case 'caliper': return differs((b) => (b.kind === 'disc' ? b.pistonDiametersMm : null), Array.isArray(specs.pistonDiametersMm) ? specs.pistonDiametersMm as number[] : null, 'pistonDiametersMm', 'piston diameter')
    case 'wheel_cylinder': return differs((b) => b.wheelCylinderBoreMm, num(specs.boreMm), 'boreMm', 'wheel cylinder bore')
    case 'disc': return differs((b) => b.discDiameterMm, num(specs.diameterMm), 'diameterMm', 'disc diameter')
    case 'drum': return differs((b) => b.drumDiameterMm, num(specs.diameterMm), 'diameterMm', 'drum diameter')
    default: return []
  }
}

async function buildBase(vehicleId: number, priceVersionId: number | null, priceVersion: number | null): Promise<Base | null> {
  const vehicle = await vehicleDetail(vehicleId)
  if (!vehicle) return null
  const db = getDb()
  const raw = await db.query<{
    fitmentId: number; partId: number; sku: string; type: PartType; productLine: string; description: string; specs: string
    axle: Row['axle']; side: string; quantity: number; qualifiers: string; note: string
    listPriceMinor: number | null; tradeCostMinor: number | null; coreDepositMinor: number | null
  }>(
    `SELECT f.id AS fitmentId, p.id AS partId, p.sku, p.type, p.product_line AS productLine, p.description, p.specs,
            f.axle, f.side, f.quantity, f.qualifiers, f.note,
            pr.list_price_minor AS listPriceMinor, pr.trade_cost_minor AS tradeCostMinor, pr.core_deposit_minor AS coreDepositMinor
       FROM fitments f
       JOIN parts p ON p.id = f.part_id AND p.status = 'active'
       LEFT JOIN part_prices pr ON pr.part_id = p.id AND :pl > 0
      WHERE f.vehicle_id = :v`,
    { type: QueryTypes.SELECT, replacements: { v: vehicleId, pl: priceVersionId ?? -1 } },
  )
  const stockRows = await db.query<{ partId: number; code: string; quantity: number }>(
    `SELECT s.part_id AS partId, b.code, s.quantity FROM stock_levels s JOIN branches b ON b.id = s.branch_id
      WHERE s.part_id IN (SELECT part_id FROM fitments WHERE vehicle_id = :v) ORDER BY b.code`,
    { type: QueryTypes.SELECT, replacements: { v: vehicleId } },
  )
  const supRows = await db.query<{ partId: number; oldSku: string }>(
    'SELECT new_part_id AS partId, old_sku AS oldSku FROM supersessions WHERE new_part_id IN (SELECT part_id FROM fitments WHERE vehicle_id = :v)',
    { type: QueryTypes.SELECT, replacements: { v: vehicleId } },
  )
  const stock = new Map<number, { branchCode: string; quantity: number }[]>()
  for (const s of stockRows) { const a = stock.get(s.partId) ?? []; a.push({ branchCode: s.code, quantity: s.quantity }); stock.set(s.partId, a) }
  const replaces = new Map<number, string[]>()
  for (const s of supRows) { const a = replaces.get(s.partId) ?? []; a.push(s.oldSku); replaces.set(s.partId, a) }
  const rows: Row[] = raw.map((r) => {
    const specs = parse<Record<string, unknown>>(r.specs, {})
    const qualifiers = parse<Qualifiers>(r.qualifiers, {})
    return {
      fitmentId: r.fitmentId, partId: r.partId, sku: r.sku, type: r.type, productLine: r.productLine, description: r.description, specs,
      axle: r.axle, side: r.side, quantity: r.quantity, qualifiers, note: r.note,
      price: r.listPriceMinor == null ? null : { listPriceMinor: r.listPriceMinor, tradeCostMinor: r.tradeCostMinor, coreDepositMinor: r.coreDepositMinor ?? 0 },
      stock: stock.get(r.partId) ?? [], replaces: replaces.get(r.partId) ?? [],
      oeDifferences: oeDifferencesOf(r.type, specs, r.axle, qualifiers, vehicle),
    }
  })
  const axleOrder = { front: 0, rear: 1, all: 2 } as const
  const typeOrder = new Map(PART_TYPES.map((t, i) => [t, i]))
  rows.sort((a, b) => (axleOrder[a.axle] ?? 3) - (axleOrder[b.axle] ?? 3) || typeOrder.get(a.type)! - typeOrder.get(b.type)!
    || Number(a.oeDifferences.length > 0) - Number(b.oeDifferences.length > 0) || a.productLine.localeCompare(b.productLine) || a.sku.localeCompare(b.sku) || a.side.localeCompare(b.side))
  return { builtAt: Date.now(), vehicle, options: vehicle.options, rows, priceVersion }
}

const AXLE_LABELS = { front: 'Front axle', rear: 'Rear axle', all: 'Whole vehicle' } as const


function trim<K, V>(m: Map<K, V>, max: number) {
  while (m.size > max) m.delete(m.keys().next().value as K)
}

/**
 * The finished JSON body (UTF-8 bytes, encoded once and sent as they are by every cached answer: at thousands of
 * requests a second, encoding a 30 KB string per response is what fills the memory) for a vehicle and answers, or
 * null when the vehicle does not exist.
 * @throws a DomainError (invalid) when an answer names an option the vehicle lacks or a value it does not offer
 */
export async function vehiclePartsBody(vehicleId: number, rawAnswers: Answers, pricing: PricingContext, now = Date.now()): Promise<Buffer | null> {
  const plId = pricing.priceVersion?.id ?? null
  const baseKey = `${vehicleId}|${plId}`
  const base = await baseFor(baseKey, now, () => buildBase(vehicleId, plId, pricing.priceVersion?.version ?? null))
  if (!base) return null

  const problems = answerProblems(base.options, rawAnswers)
  if (Object.keys(problems).length) throw invalidInput(problems, 'Some option answers do not fit this vehicle.')
  const answers = canonicalAnswers(base.options, rawAnswers)
  const answersKey = Object.keys(answers).sort().map((k) => `${k}=${answers[k]}`).join('&')
  const key = `${baseKey}|${viewKey(pricing.view)}|${answersKey}`
  const cached = cacheOn() ? responses.get(key) : undefined
  if (cached && cached.builtAt === base.builtAt) return cached.body

  const body = Buffer.from(JSON.stringify(render(base, answers, pricing)), 'utf8')
  if (cacheOn()) responses.set(key, { builtAt: base.builtAt, body })
  trim(responses, MAX_RESPONSES)
  return body
}

/** The cached base for a key, rebuilt when older than the stock TTL; concurrent misses share one build. */
async function baseFor(key: string, now: number, build: () => Promise<Base | null>): Promise<Base | null> {
  if (!cacheOn()) return build()
  const entry = bases.get(key)
  if (entry) {
    const b = await entry.catch(() => null)
    if (b && now - b.builtAt <= STOCK_TTL_MS) return b
    if (bases.get(key) === entry) bases.delete(key)
  }
  let pending = bases.get(key)
  if (!pending) {
    pending = build()
    bases.set(key, pending)
    trim(bases, MAX_BASES)
    const mine = pending
    pending.then((b) => { if (!b && bases.get(key) === mine) bases.delete(key) }, () => { if (bases.get(key) === mine) bases.delete(key) })
  }
  return pending
}

function render(base: Base, answers: Answers, pricing: PricingContext) {
  const v = base.vehicle
  const kept = base.rows.map((r) => ({ r, m: matchQualifiers(r.qualifiers, answers) })).filter((x) => x.m !== 'excluded')
  const groups: { axle: string; label: string; types: { type: PartType; label: string; parts: unknown[] }[] }[] = []
  for (const { r, m } of kept) {
    let g = groups.find((x) => x.axle === r.axle)
    if (!g) groups.push((g = { axle: r.axle, label: AXLE_LABELS[r.axle] ?? r.axle, types: [] }))
    let t = g.types.find((x) => x.type === r.type)
    if (!t) g.types.push((t = { type: r.type, label: PART_TYPE_LABELS[r.type]?.many ?? r.type, parts: [] }))
    const dependsOn = Object.keys(r.qualifiers).filter((k) => answerFor(k, answers) === undefined)
    t.parts.push({
      fitmentId: r.fitmentId, sku: r.sku, type: r.type, productLine: r.productLine, description: r.description, specs: r.specs,
      side: r.side, quantity: r.quantity, qualifiers: r.qualifiers, note: r.note, fit: m, ...(dependsOn.length ? { dependsOn } : {}),
      stock: r.stock, stockTotal: r.stock.reduce((s, x) => s + x.quantity, 0),
      ...priceFields(pricing.view, r.price),
      ...(r.replaces.length ? { replaces: r.replaces } : {}),
      ...(r.oeDifferences.length ? { oeDifferences: r.oeDifferences } : {}),
    })
  }
  return {
    vehicle: {
      id: v.id, label: v.label, make: v.make, model: v.model, generation: v.generation, body: v.body, yearFrom: v.yearFrom, yearTo: v.yearTo,
      engine: v.engine, engineCode: v.engineCode, fuel: v.fuel, drive: v.drive, circuitSplit: v.circuitSplit, steeringSide: v.steeringSide ?? null, fluidGrade: v.fluidGrade,
      tyreSize: v.tyreSize, kerbMassKg: v.kerbMassKg, mcBoreMm: v.mcBoreMm, parkingBrake: v.parkingBrake,
      brakes: v.brakes.filter((b) => matchQualifiers(b.qualifiers, answers) !== 'excluded'),
    },
    priceVersion: pricing.view.kind === 'none' ? null : base.priceVersion,
    answers: Object.entries(answers).map(([key, value]) => {
      const o = base.options.find((x) => x.key === key)
      // the car's VIN and build month narrow VIN-pattern and build-date breakpoints; they are not option questions
      if (!o) return { key, label: IDENTITY_LABELS[key] ?? key, value, valueLabel: value }
      return { key, label: o.label, value, valueLabel: o.values.find((x) => x.value === value)?.label ?? value }
    }),
    questions: openQuestions(base.options, base.rows, answers),
    groups,
    counts: { shown: kept.length, excluded: base.rows.length - kept.length, total: base.rows.length },
  }
}

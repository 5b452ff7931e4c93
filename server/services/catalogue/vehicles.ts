/**
 * Vehicles for the finder: a light in-memory list (cached until the catalogue changes) from which the facets
 * make -> model -> year -> engine/variant are counted, and the full record of one vehicle. Plain Node.
 */
import { QueryTypes, type InferAttributes } from 'sequelize'
import { getDb } from '../../utils/db'
import { Vehicle, VehicleBrake, VehicleOption } from '../../models/catalogue'
import type { VehicleFacetsQuery } from '../../../shared/schemas/catalogue/vehicle-queries'

export interface VehicleSummary {
  id: number; make: string; model: string; generation: string; body: string; yearFrom: number; yearTo: number | null
  engineCode: string; engineCc: number | null; fuel: string; powerKw: number | null; drive: string
  partCount: number; questionCount: number
}

let list: Promise<VehicleSummary[]> | null = null

export function invalidateVehicleList(): void { list = null }

/** Every vehicle with its fitment and option counts. */
export function vehicleSummaries(): Promise<VehicleSummary[]> {
  list ??= (async () => {
    const db = getDb()
    const rows = await db.query<VehicleSummary>(
      `SELECT v.id, v.make, v.model, v.generation, v.body, v.year_from AS yearFrom, v.year_to AS yearTo, v.engine_code AS engineCode,
              v.engine_cc AS engineCc, v.fuel, v.power_kw AS powerKw, v.drive,
              (SELECT COUNT(*) FROM fitments f WHERE f.vehicle_id = v.id) AS partCount,
              (SELECT COUNT(*) FROM vehicle_options o WHERE o.vehicle_id = v.id) AS questionCount
         FROM vehicles v ORDER BY v.make, v.model, v.year_from, v.generation, v.engine_code`,
      { type: QueryTypes.SELECT },
    )
    return rows
  })().catch((err) => { list = null; throw err })
  return list
}

/** "Veltra Pennon Mk2 hatchback, 1.4 petrol 110 kW (2018-)". */
export function vehicleLabel(v: Pick<VehicleSummary, 'make' | 'model' | 'generation' | 'body' | 'yearFrom' | 'yearTo'> & Partial<VehicleSummary>): string {
  const years = `${v.yearFrom}–${v.yearTo ?? ''}`
  const engine = v.engineCode !== undefined ? `, ${engineLabel(v as VehicleSummary)}` : ''
  return `${[v.make, v.model, v.generation, v.body].filter(Boolean).join(' ')}${engine} (${years})`
}

export function engineLabel(v: Pick<VehicleSummary, 'engineCc' | 'fuel' | 'powerKw' | 'engineCode'>): string {
  const size = v.engineCc ? `${(v.engineCc / 1000).toFixed(1)} ` : ''
  return `${size}${v.fuel}${v.powerKw ? ` ${v.powerKw} kW` : ''}${v.engineCode ? ` (${v.engineCode})` : ''}`
}

const thisYear = () => new Date().getFullYear()
const same = (a: string, b: string) => a.localeCompare(b, 'en', { sensitivity: 'accent' }) === 0

export interface FacetCount { value: string; count: number }
export interface Facets {
  selection: { make: string | null; model: string | null; year: number | null }
  makes: FacetCount[]
  models: FacetCount[] | null
  years: { value: number; count: number }[] | null
  variants: (VehicleSummary & { vehicleId: number; label: string; engine: string })[] | null
}

/** Counts per step of the finder. Names compare without regard to case. */
export function facetsOf(all: VehicleSummary[], q: VehicleFacetsQuery): Facets {
  const count = (xs: string[]) => {
    const m = new Map<string, number>()
    for (const x of xs) m.set(x, (m.get(x) ?? 0) + 1)
    return [...m].map(([value, n]) => ({ value, count: n })).sort((a, b) => a.value.localeCompare(b.value))
  }
  const out: Facets = { selection: { make: null, model: null, year: null }, makes: count(all.map((v) => v.make)), models: null, years: null, variants: null }
  if (!q.make) return out
  const ofMake = all.filter((v) => same(v.make, q.make!))
  out.selection.make = ofMake[0]?.make ?? q.make
  out.models = count(ofMake.map((v) => v.model))
  if (!q.model) return out
  const ofModel = ofMake.filter((v) => same(v.model, q.model!))
  out.selection.model = ofModel[0]?.model ?? q.model
  const years = new Map<number, number>()
  for (const v of ofModel) for (let y = v.yearFrom; y <= (v.yearTo ?? thisYear()); y++) years.set(y, (years.get(y) ?? 0) + 1)
  out.years = [...years].map(([value, n]) => ({ value, count: n })).sort((a, b) => b.value - a.value)
  if (!q.year) return out
  out.selection.year = q.year
  out.variants = ofModel.filter((v) => v.yearFrom <= q.year! && (v.yearTo ?? thisYear()) >= q.year!)
    .map((v) => ({ ...v, vehicleId: v.id, label: vehicleLabel(v), engine: engineLabel(v) }))
  return out
}

/** The full vehicle record: original-equipment brakes per axle (with their qualifiers) and option questions. */
export async function vehicleDetail(id: number) {
  const v = await Vehicle.findByPk(id)
  if (!v) return null
  const [options, brakes, counts] = await Promise.all([
    VehicleOption.findAll({ where: { vehicleId: id }, order: [['id', 'ASC']] }),
    VehicleBrake.findAll({ where: { vehicleId: id }, order: [['axle', 'ASC'], ['id', 'ASC']] }),
    getDb().query<{ n: number }>('SELECT COUNT(*) AS n FROM fitments WHERE vehicle_id = :id', { type: QueryTypes.SELECT, replacements: { id } }),
  ])
  const { createdAt: _created, updatedAt: _updated, ...plain } = v.get({ plain: true }) as InferAttributes<Vehicle>
  return {
    ...plain,
    id: v.id,
    label: vehicleLabel(v),
    engine: engineLabel(v),
    partCount: Number(counts[0]?.n ?? 0),
    options: options.map((o) => ({ key: o.key, label: o.label, question: o.question, values: o.values })),
    brakes: brakes.map((b) => ({
      axle: b.axle, qualifiers: b.qualifiers, kind: b.kind,
      discDiameterMm: b.discDiameterMm, discThicknessMm: b.discThicknessMm, discMinThicknessMm: b.discMinThicknessMm, discVented: b.discVented,
      drumDiameterMm: b.drumDiameterMm, drumMaxDiameterMm: b.drumMaxDiameterMm,
      caliperType: b.caliperType, pistonDiametersMm: b.pistonDiametersMm, wheelCylinderBoreMm: b.wheelCylinderBoreMm,
      maxRunoutMm: b.maxRunoutMm, maxThicknessVariationMm: b.maxThicknessVariationMm,
    })),
  }
}
export type VehicleDetail = NonNullable<Awaited<ReturnType<typeof vehicleDetail>>>

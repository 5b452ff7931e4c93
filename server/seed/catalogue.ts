/**
 * Writes the invented demo catalogue ({@link buildCatalogue}) with stock in both branches and price version 1.
 * Idempotent: rows are found by their natural keys (vehicle make/model/generation/engine code, option key, SKU,
 * OE number, old SKU, fitment vehicle/part/axle/side/qualifiers, stock part/branch, price version) and only
 * missing rows are inserted, in bulk, so a second run changes nothing.
 */
import type { Transaction } from 'sequelize'
import { Branch, Organisation } from '../models/accounts'
import {
  Fitment, Part, PartOeNumber, PartPrice, PriceVersion, StockLevel, Supersession, Vehicle, VehicleBrake, VehicleOption,
} from '../models/catalogue'
import { normaliseIdentifier } from '../../shared/schemas/catalogue/params'
import { parseSpecs } from '../../shared/schemas/catalogue/specs'
import { buildCatalogue, BORE_MISMATCH, type SeedVehicle } from './catalogue-data'

const vehicleKey = (v: { make: string; model: string; generation: string; engineCode: string }) => `${v.make}|${v.model}|${v.generation}|${v.engineCode}`
const stable = (o: Record<string, string>) => JSON.stringify(Object.fromEntries(Object.entries(o).sort(([a], [b]) => a.localeCompare(b))))

/** The garage whose technicians may see trade prices in the demo (the setting defaults to off). */
export const DEMO_GARAGE_TECHNICIANS_SEE_PRICES = 'Tannery Yard Autos'

export async function seedCatalogue(t: Transaction, log: (s: string) => void): Promise<void> {
  const data = buildCatalogue()
  const opts = { transaction: t }
  // every spec passes its schema before it reaches the database
  for (const p of data.parts) parseSpecs(p.type, p.specs)

  const branches = new Map((await Branch.findAll(opts)).map((b) => [b.code, b.id]))
  if (!branches.has('NGT') || !branches.has('RVS')) throw new Error('catalogue seed needs the NGT and RVS branches (run the accounts seed first)')

  // vehicles
  const vehicleIds = new Map<string, number>()
  for (const v of await Vehicle.findAll({ attributes: ['id', 'make', 'model', 'generation', 'engineCode'], ...opts })) vehicleIds.set(vehicleKey(v), v.id)
  const seedKeyToDb = new Map<string, string>()
  const newVehicles = []
  for (const v of data.vehicles) {
    const k = vehicleKey(v)
    seedKeyToDb.set(v.key, k)
    if (vehicleIds.has(k)) continue
    const { key: _key, options: _o, brakes: _b, ...row } = v
    newVehicles.push(row)
  }
  if (newVehicles.length) {
    await Vehicle.bulkCreate(newVehicles, opts)
    for (const v of await Vehicle.findAll({ attributes: ['id', 'make', 'model', 'generation', 'engineCode'], ...opts })) vehicleIds.set(vehicleKey(v), v.id)
  }
  const vid = (seedKey: string) => vehicleIds.get(seedKeyToDb.get(seedKey)!)!
  await fillVehicleDynamics(data.vehicles, t)

  // options and original-equipment brakes
  const haveOptions = new Set((await VehicleOption.findAll({ attributes: ['vehicleId', 'key'], ...opts })).map((o) => `${o.vehicleId}|${o.key}`))
  const haveBrakes = new Set((await VehicleBrake.findAll({ attributes: ['vehicleId', 'axle', 'kind', 'qualifiers'], ...opts })).map((b) => `${b.vehicleId}|${b.axle}|${b.kind}|${stable(b.qualifiers)}`))
  const newOptions = [], newBrakes = []
  for (const v of data.vehicles) {
    const id = vid(v.key)
    for (const o of v.options) if (!haveOptions.has(`${id}|${o.key}`)) newOptions.push({ vehicleId: id, ...o })
    for (const b of v.brakes) if (!haveBrakes.has(`${id}|${b.axle}|${b.kind}|${stable(b.qualifiers)}`)) newBrakes.push({ vehicleId: id, ...b })
  }
  if (newOptions.length) await VehicleOption.bulkCreate(newOptions, opts)
  if (newBrakes.length) await VehicleBrake.bulkCreate(newBrakes, opts)

  // parts, OE numbers
  const partIds = new Map((await Part.findAll({ attributes: ['id', 'sku'], ...opts })).map((p) => [p.sku, p.id]))
  const newParts = data.parts.filter((p) => !partIds.has(p.sku)).map((p) => ({
    sku: p.sku, type: p.type, productLine: p.productLine, description: p.description, specs: p.specs, status: p.status,
  }))
  if (newParts.length) {
    for (let i = 0; i < newParts.length; i += 200) await Part.bulkCreate(newParts.slice(i, i + 200), opts)
    for (const p of await Part.findAll({ attributes: ['id', 'sku'], ...opts })) partIds.set(p.sku, p.id)
  }
  const haveOe = new Set((await PartOeNumber.findAll({ attributes: ['partId', 'oeNormalised'], ...opts })).map((o) => `${o.partId}|${o.oeNormalised}`))
  const newOe = []
  for (const p of data.parts) {
    for (const oe of p.oe) {
      const n = normaliseIdentifier(oe.oeNumber)
      const id = partIds.get(p.sku)!
      if (!haveOe.has(`${id}|${n}`)) { newOe.push({ partId: id, oeNumber: oe.oeNumber, oeNormalised: n, maker: oe.maker }); haveOe.add(`${id}|${n}`) }
    }
  }
  if (newOe.length) await PartOeNumber.bulkCreate(newOe, opts)

  const haveSup = new Set((await Supersession.findAll({ attributes: ['oldSku'], ...opts })).map((s) => s.oldSku))
  const newSup = data.supersessions.filter((s) => !haveSup.has(s.oldSku)).map((s) => ({ oldSku: s.oldSku, newPartId: partIds.get(s.newSku)!, note: s.note }))
  if (newSup.length) await Supersession.bulkCreate(newSup, opts)

  // fitments
  const haveFit = new Set((await Fitment.findAll({ attributes: ['vehicleId', 'partId', 'axle', 'side', 'qualifiers'], ...opts }))
    .map((f) => `${f.vehicleId}|${f.partId}|${f.axle}|${f.side}|${stable(f.qualifiers)}`))
  const newFit = []
  for (const f of data.fitments) {
    const row = { vehicleId: vid(f.vehicleKey), partId: partIds.get(f.sku)!, axle: f.axle, side: f.side, quantity: f.quantity, qualifiers: f.qualifiers, note: f.note }
    const k = `${row.vehicleId}|${row.partId}|${row.axle}|${row.side}|${stable(row.qualifiers)}`
    if (!haveFit.has(k)) { newFit.push(row); haveFit.add(k) }
  }
  for (let i = 0; i < newFit.length; i += 500) await Fitment.bulkCreate(newFit.slice(i, i + 500), opts)

  // stock in both branches (some at zero)
  const haveStock = new Set((await StockLevel.findAll({ attributes: ['partId', 'branchId'], ...opts })).map((s) => `${s.partId}|${s.branchId}`))
  const newStock = []
  for (const p of data.parts) {
    for (const code of ['NGT', 'RVS'] as const) {
      const partId = partIds.get(p.sku)!, branchId = branches.get(code)!
      if (!haveStock.has(`${partId}|${branchId}`)) newStock.push({ partId, branchId, quantity: p.stock[code] })
    }
  }
  for (let i = 0; i < newStock.length; i += 500) await StockLevel.bulkCreate(newStock.slice(i, i + 500), opts)

  // price version 1, active unless another version already is
  let list = await PriceVersion.findOne({ where: { version: 1 }, ...opts })
  if (!list) {
    const active = await PriceVersion.findOne({ where: { status: 'active' }, ...opts })
    list = await PriceVersion.create({
      version: 1, label: 'Trade prices 2026 (opening)', status: active ? 'retired' : 'active',
      effectiveAt: new Date('2026-10-01T00:00:00Z'), activatedAt: new Date('2026-10-01T00:00:00Z'),
    }, opts)
  }
  // prices in use: one row per part, set by the version that is active (demo parts not priced yet get one)
  const activeList = await PriceVersion.findOne({ where: { status: 'active' }, ...opts })
  const setBy = (activeList ?? list).id
  const havePrice = new Set((await PartPrice.findAll({ attributes: ['partId'], ...opts })).map((p) => p.partId))
  const newPrices = data.parts.filter((p) => !havePrice.has(partIds.get(p.sku)!)).map((p) => ({
    partId: partIds.get(p.sku)!, listPriceMinor: p.listPriceMinor, tradeCostMinor: p.tradeCostMinor, coreDepositMinor: p.coreDepositMinor, packQuantity: 1, priceVersionId: setBy,
  }))
  for (let i = 0; i < newPrices.length; i += 500) await PartPrice.bulkCreate(newPrices.slice(i, i + 500), opts)

  // one demo garage lets its technicians see trade prices
  await Organisation.update({ techniciansSeePrices: true }, { where: { name: DEMO_GARAGE_TECHNICIANS_SEE_PRICES, kind: 'garage', techniciansSeePrices: false }, ...opts })

  const makes = new Set(data.vehicles.map((v) => v.make)).size
  log(`catalogue: ${makes} makes, ${data.vehicles.length} vehicles, ${data.parts.length} parts, ${data.fitments.length} fitments, ${data.supersessions.length} supersessions (new rows: ${newVehicles.length} vehicles, ${newParts.length} parts, ${newFit.length} fitments); bore-change pairs: ${BORE_MISMATCH.masterCylinder.make} ${BORE_MISMATCH.masterCylinder.model} master cylinder, ${BORE_MISMATCH.caliper.make} ${BORE_MISMATCH.caliper.model} ${BORE_MISMATCH.caliper.generation} front caliper`)
}

const DYNAMICS_FIELDS = [
  'boosterRunOutKPa', 'wheelbaseMm', 'cogHeightMm', 'frontStaticSharePercent', 'ladenMassKg', 'ladenCogHeightMm',
  'ladenFrontSharePercent', 'rearValveKneeKPa', 'rearValveLadenKneeKPa', 'rearValveSlope', 'electronicDistribution',
] as const

/**
 * Demo vehicles seeded before a figure existed get it: the grip and balance figures (while `wheelbaseMm` is empty)
 * and the steering side (while it is empty); vehicles that have them are left alone.
 */
async function fillVehicleDynamics(vehicles: SeedVehicle[], t: Transaction): Promise<void> {
  const byKey = new Map(vehicles.map((v) => [vehicleKey(v), v]))
  for (const [empty, fields] of [['wheelbaseMm', DYNAMICS_FIELDS], ['steeringSide', ['steeringSide']]] as const) {
    const bare = await Vehicle.findAll({ where: { [empty]: null }, attributes: ['id', 'make', 'model', 'generation', 'engineCode'], transaction: t })
    for (const row of bare) {
      const seed = byKey.get(vehicleKey(row))
      if (seed) await row.update(Object.fromEntries(fields.map((f) => [f, seed[f]])), { transaction: t })
    }
  }
}

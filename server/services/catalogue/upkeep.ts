/**
 * Catalogue upkeep by counter staff: create and edit parts (specs validated by the part type's schema), add,
 * change and remove fitment, record a supersession. Every change runs in one write transaction with its audit
 * entry, then refreshes the search index and drops the cached vehicle lists. Errors are field-keyed for a 422.
 * Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { ZodError } from 'zod'
import { audit } from '../../utils/audit'
import { Fitment, Part, PartOeNumber, Supersession, Vehicle, VehicleBrake, VehicleOption } from '../../models/catalogue'
import type { FitmentInput } from '../../../shared/schemas/catalogue/fitments'
import { normaliseIdentifier } from '../../../shared/schemas/catalogue/params'
import type { PartType } from '../../../shared/schemas/catalogue/part-types'
import { axleOfSpecs, parseSpecs } from '../../../shared/schemas/catalogue/specs'
import type { PartCreateInput, PartPatchInput, VehiclePatchInput } from '../../../shared/schemas/catalogue/upkeep'
import { answerProblems, canonicalAnswers } from '../../../shared/utils/catalogue/qualifiers'
import { catalogueWrite } from './changes'
import { oeDifferencesOf } from './vehicle-parts'
import { conflict, invalidInput, notFound } from '../errors'

function specsOrThrow(type: PartType, specs: unknown) {
  try {
    return parseSpecs(type, specs)
  } catch (err) {
    if (!(err instanceof ZodError)) throw err
    const fields: Record<string, string> = {}
    for (const i of err.issues) {
      if (i.code === 'unrecognized_keys') for (const k of i.keys) fields[`specs.${[...i.path, k].join('.')}`] ??= `${k} is not a ${type} specification`
      else fields[['specs', ...i.path.map(String)].join('.')] ??= i.message
    }
    throw invalidInput(fields, 'The specifications need attention.')
  }
}

function dedupeOe(list: { oeNumber: string; maker: string }[]) {
  const seen = new Set<string>()
  return list.filter((o) => { const n = normaliseIdentifier(o.oeNumber); if (seen.has(n)) return false; seen.add(n); return true })
}

async function replaceOe(t: Transaction, partId: number, list: { oeNumber: string; maker: string }[]) {
  await PartOeNumber.destroy({ where: { partId }, transaction: t })
  const rows = dedupeOe(list).map((o) => ({ partId, oeNumber: o.oeNumber, oeNormalised: normaliseIdentifier(o.oeNumber), maker: o.maker }))
  if (rows.length) await PartOeNumber.bulkCreate(rows, { transaction: t })
}

const snapshot = async (t: Transaction, p: Part) => ({
  productLine: p.productLine, description: p.description, status: p.status, specs: p.specs,
  oeNumbers: (await PartOeNumber.findAll({ where: { partId: p.id }, transaction: t, order: [['id', 'ASC']] })).map((o) => o.oeNumber),
})

function diff(before: Record<string, unknown>, after: Record<string, unknown>) {
  const out: Record<string, { from: unknown; to: unknown }> = {}
  for (const k of Object.keys(after)) if (JSON.stringify(before[k]) !== JSON.stringify(after[k])) out[k] = { from: before[k], to: after[k] }
  return out
}

export async function createPart(actorUserId: number, input: PartCreateInput): Promise<Part> {
  const specs = specsOrThrow(input.type, input.specs)
  return catalogueWrite(async (t) => {
    if (await Part.findOne({ where: { sku: input.sku }, transaction: t }) || await Supersession.findOne({ where: { oldSku: input.sku }, transaction: t })) {
      throw conflict(`SKU ${input.sku} is already in the catalogue.`, undefined, { sku: 'this SKU is already in use' })
    }
    const p = await Part.create({ sku: input.sku, type: input.type, productLine: input.productLine, description: input.description, specs, status: 'active' }, { transaction: t })
    await replaceOe(t, p.id, input.oeNumbers)
    await audit(t, { actorUserId, action: 'catalogue.part.create', entity: 'part', entityId: p.sku, changes: { after: await snapshot(t, p), type: p.type } })
    return { result: p, partIds: [p.id] }
  })
}

export async function patchPart(actorUserId: number, sku: string, input: PartPatchInput): Promise<Part> {
  return catalogueWrite(async (t) => {
    const p = await Part.findOne({ where: { sku }, transaction: t })
    if (!p) throw notFound(`Part ${sku}`)
    const before = await snapshot(t, p)
    if (input.specs !== undefined) p.specs = specsOrThrow(p.type as PartType, input.specs)
    if (input.description !== undefined) p.description = input.description
    if (input.productLine !== undefined) p.productLine = input.productLine
    if (input.status !== undefined) p.status = input.status
    if (input.specs !== undefined) {
      // a spec change must not move the part to another axle under its existing fitment
      const axle = axleOfSpecs(p.type as PartType, p.specs) ?? 'all'
      const clash = await Fitment.count({ where: { partId: p.id, axle: { [Op.ne]: axle } }, transaction: t })
      if (clash) throw invalidInput({ [`specs.${'axle' in p.specs ? 'axle' : 'position'}`]: `this part is fitted on another axle on ${clash} vehicle(s); change that fitment first` }, 'The specifications need attention.')
    }
    await p.save({ transaction: t })
    if (input.oeNumbers !== undefined) await replaceOe(t, p.id, input.oeNumbers)
    const changes = diff(before, await snapshot(t, p))
    await audit(t, { actorUserId, action: 'catalogue.part.update', entity: 'part', entityId: p.sku, changes })
    return { result: p, partIds: [p.id] }
  })
}

/** Checks a fitment against its part and vehicle; returns canonical qualifiers. */
async function checkFitment(t: Transaction, part: Part, f: Pick<FitmentInput, 'vehicleId' | 'axle' | 'qualifiers' | 'note'>) {
  const vehicle = await Vehicle.findByPk(f.vehicleId, { transaction: t })
  if (!vehicle) throw invalidInput({ vehicleId: `there is no vehicle ${f.vehicleId}` }, 'The fitment needs attention.')
  const expected = axleOfSpecs(part.type as PartType, part.specs) ?? 'all'
  if (f.axle !== expected) throw invalidInput({ axle: expected === 'all' ? 'this part serves the whole vehicle: use axle "all"' : `this part is made for the ${expected} axle` }, 'The fitment needs attention.')
  const options = (await VehicleOption.findAll({ where: { vehicleId: vehicle.id }, transaction: t })).map((o) => ({ key: o.key, label: o.label, question: o.question, values: o.values }))
  const problems = answerProblems(options, f.qualifiers)
  if (Object.keys(problems).length) {
    throw invalidInput(Object.fromEntries(Object.entries(problems).map(([k, v]) => [`qualifiers.${k.slice(4)}`, v])), 'The fitment needs attention.')
  }
  const qualifiers = canonicalAnswers(options, f.qualifiers)
  // a part whose bore or size differs from the vehicle's original equipment is listed only with a note saying so
  const brakes = (await VehicleBrake.findAll({ where: { vehicleId: vehicle.id }, transaction: t })).map((b) => ({
    axle: b.axle, qualifiers: b.qualifiers, kind: b.kind, pistonDiametersMm: b.pistonDiametersMm, wheelCylinderBoreMm: b.wheelCylinderBoreMm,
    discDiameterMm: b.discDiameterMm, drumDiameterMm: b.drumDiameterMm,
  }))
  const differences = oeDifferencesOf(part.type as PartType, part.specs, f.axle, qualifiers, { mcBoreMm: vehicle.mcBoreMm, brakes } as never)
  if (differences.length && !f.note.trim()) {
    const d = differences[0]!
    throw invalidInput({ note: `the part's ${d.label} (${String(d.part)} mm) differs from this vehicle's original (${String(d.oe)} mm): say so in the note` }, 'The fitment needs attention.')
  }
  return { vehicle, qualifiers }
}

const fitmentKey = (f: { vehicleId: number; axle: string; side: string; qualifiers: Record<string, string> }) =>
  `${f.vehicleId}|${f.axle}|${f.side}|${JSON.stringify(Object.fromEntries(Object.entries(f.qualifiers).sort()))}`

export async function addFitment(actorUserId: number, sku: string, input: FitmentInput): Promise<Fitment> {
  return catalogueWrite(async (t) => {
    const part = await Part.findOne({ where: { sku }, transaction: t })
    if (!part) throw notFound(`Part ${sku}`)
    const { qualifiers } = await checkFitment(t, part, input)
    const existing = await Fitment.findAll({ where: { partId: part.id, vehicleId: input.vehicleId }, transaction: t })
    if (existing.some((e) => fitmentKey(e) === fitmentKey({ ...input, qualifiers }))) {
      throw conflict('This part is already fitted to that vehicle in the same place.', undefined, { vehicleId: 'already fitted with these qualifiers' })
    }
    const f = await Fitment.create({ vehicleId: input.vehicleId, partId: part.id, axle: input.axle, side: input.side, quantity: input.quantity, qualifiers, note: input.note }, { transaction: t })
    await audit(t, { actorUserId, action: 'catalogue.fitment.create', entity: 'fitment', entityId: f.id, changes: { sku, vehicleId: f.vehicleId, axle: f.axle, side: f.side, quantity: f.quantity, qualifiers, note: f.note } })
    return { result: f, partIds: [part.id] }
  })
}

export async function patchFitment(actorUserId: number, id: number, input: Partial<FitmentInput>): Promise<Fitment> {
  return catalogueWrite(async (t) => {
    const f = await Fitment.findByPk(id, { transaction: t })
    if (!f) throw notFound('Fitment')
    const part = (await Part.findByPk(f.partId, { transaction: t }))!
    const before = { axle: f.axle, side: f.side, quantity: f.quantity, qualifiers: f.qualifiers, note: f.note }
    const next = { vehicleId: f.vehicleId, axle: (input.axle ?? f.axle) as FitmentInput['axle'], side: input.side ?? f.side, quantity: input.quantity ?? f.quantity, qualifiers: input.qualifiers ?? f.qualifiers, note: input.note ?? f.note }
    const { qualifiers } = await checkFitment(t, part, next)
    Object.assign(f, { axle: next.axle, side: next.side, quantity: next.quantity, qualifiers, note: next.note })
    await f.save({ transaction: t })
    await audit(t, { actorUserId, action: 'catalogue.fitment.update', entity: 'fitment', entityId: f.id, changes: diff(before, { axle: f.axle, side: f.side, quantity: f.quantity, qualifiers: f.qualifiers, note: f.note }) })
    return { result: f, partIds: [part.id] }
  })
}

/** Records what counter staff know about a catalogued vehicle (its steering side: the job card's bleeding order). */
export async function patchVehicle(actorUserId: number, id: number, input: VehiclePatchInput): Promise<Vehicle> {
  return catalogueWrite(async (t) => {
    const v = await Vehicle.findByPk(id, { transaction: t })
    if (!v) throw notFound(`Vehicle ${id}`)
    const before = { steeringSide: v.steeringSide ?? null }
    v.steeringSide = input.steeringSide
    await v.save({ transaction: t })
    await audit(t, { actorUserId, action: 'catalogue.vehicle.update', entity: 'vehicle', entityId: v.id, changes: diff(before, { steeringSide: v.steeringSide }) })
    return { result: v, partIds: [] }
  })
}

export async function deleteFitment(actorUserId: number, id: number): Promise<void> {
  await catalogueWrite(async (t) => {
    const f = await Fitment.findByPk(id, { transaction: t })
    if (!f) throw notFound('Fitment')
    const part = await Part.findByPk(f.partId, { transaction: t })
    await f.destroy({ transaction: t })
    await audit(t, { actorUserId, action: 'catalogue.fitment.delete', entity: 'fitment', entityId: id, changes: { sku: part?.sku, vehicleId: f.vehicleId, axle: f.axle, side: f.side, qualifiers: f.qualifiers } })
    return { result: undefined, partIds: [f.partId] }
  })
}

/** Marks `sku` discontinued and replaced by `newSku`: searching the old SKU then finds the new part. */
export async function supersedePart(actorUserId: number, sku: string, newSku: string, note: string): Promise<void> {
  await catalogueWrite(async (t) => {
    const old = await Part.findOne({ where: { sku }, transaction: t })
    if (!old) throw notFound(`Part ${sku}`)
    const next = await Part.findOne({ where: { sku: newSku }, transaction: t })
    if (!next) throw invalidInput({ newSku: `there is no part ${newSku}` }, 'The supersession needs attention.')
    if (next.id === old.id) throw invalidInput({ newSku: 'a part cannot replace itself' }, 'The supersession needs attention.')
    if (next.type !== old.type) throw invalidInput({ newSku: `${newSku} is a ${next.type}, ${sku} a ${old.type}` }, 'The supersession needs attention.')
    if (next.status !== 'active') throw invalidInput({ newSku: `${newSku} is discontinued itself` }, 'The supersession needs attention.')
    if (await Supersession.findOne({ where: { oldSku: sku }, transaction: t })) throw conflict(`${sku} is already superseded.`)
    const text = note || `${sku} was replaced by ${newSku}.`
    await Supersession.create({ oldSku: sku, newPartId: next.id, note: text }, { transaction: t })
    // earlier SKUs that pointed at the old part now point at the new one
    await Supersession.update({ newPartId: next.id }, { where: { newPartId: old.id }, transaction: t })
    old.status = 'discontinued'
    await old.save({ transaction: t })
    await audit(t, { actorUserId, action: 'catalogue.part.supersede', entity: 'part', entityId: sku, changes: { replacedBy: newSku, note: text } })
    return { result: undefined, partIds: [old.id, next.id] }
  })
}

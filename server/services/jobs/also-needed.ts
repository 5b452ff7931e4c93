/**
 * "Also needed": what a part needs beside it (its relations in the catalogue), with the quantity for the vehicle
 * (fluid by the vehicle's capacity and the pack's volume) and whether it fits that vehicle; and the relations'
 * upkeep by counter staff. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { Fitment, Part } from '../../models/catalogue'
import { PartRelation, VehicleJobData } from '../../models/jobs'
import { QuoteLine } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { fluidPacks, type PartRelationKind } from '../../../shared/utils/jobs/relations'
import type { AlsoNeeded } from '../../../shared/types/jobs'
import { invalidInput, notFound } from '../errors'

/** The relations of a part; with a vehicle, quantities for it and `fits` (otherwise `fits` is null). */
export async function alsoNeededFor(partId: number, vehicleId?: number | null, t?: Transaction): Promise<AlsoNeeded[]> {
  const rows = await PartRelation.findAll({
    where: { partId }, include: [{ model: Part, as: 'related', attributes: ['id', 'sku', 'description', 'specs', 'status'] }],
    order: [['id', 'ASC']], transaction: t,
  })
  const live = rows.filter((r) => r.related && r.related.status === 'active')
  const [data, fitting] = vehicleId
    ? await Promise.all([
        VehicleJobData.findByPk(vehicleId, { transaction: t }),
        Fitment.findAll({ where: { vehicleId, partId: { [Op.in]: live.map((r) => r.relatedPartId) } }, attributes: ['partId', 'quantity'], transaction: t }),
      ])
    : [null, []]
  return live.map((r) => {
    const fit = fitting.find((f) => f.partId === r.relatedPartId)
    const packMl = Number((r.related!.specs as { volumeMl?: number }).volumeMl) || null
    return {
      sku: r.related!.sku, relation: r.relation, description: r.related!.description, reason: r.reason,
      quantity: r.byFluidVolume ? fluidPacks(data?.fluidCapacityMl, packMl, r.quantity) : (fit?.quantity ?? r.quantity),
      fits: vehicleId ? !!fit : null,
    }
  })
}

export interface RelationInput { sku: string; relation: PartRelationKind; quantity: number; byFluidVolume?: boolean; reason: string }

/** Replaces a part's relations with the list given (counter staff on the part's edit page); audited. */
export async function setRelations(partSku: string, list: RelationInput[], actorUserId: number): Promise<AlsoNeeded[]> {
  return withWrite(async (t) => {
    const part = await Part.findOne({ where: { sku: partSku }, transaction: t })
    if (!part) throw notFound(`Part ${partSku}`)
    const related = await Part.findAll({ where: { sku: { [Op.in]: list.map((l) => l.sku) } }, transaction: t })
    const problems: Record<string, string> = {}
    list.forEach((l, i) => {
      if (!related.some((p) => p.sku === l.sku)) problems[`relations.${i}.sku`] = `No part ${l.sku} in the catalogue.`
      else if (l.sku === part.sku) problems[`relations.${i}.sku`] = 'A part cannot need itself.'
    })
    if (new Set(list.map((l) => l.sku)).size !== list.length) problems.relations = 'Each part is listed once.'
    if (Object.keys(problems).length) throw invalidInput(problems)
    await PartRelation.destroy({ where: { partId: part.id }, transaction: t })
    for (const l of list) {
      await PartRelation.create({
        partId: part.id, relatedPartId: related.find((p) => p.sku === l.sku)!.id, relation: l.relation,
        quantity: l.quantity, byFluidVolume: !!l.byFluidVolume, reason: l.reason,
      }, { transaction: t })
    }
    await audit(t, { actorUserId, organisationId: null, action: 'part.relations', entity: 'part', entityId: part.id, changes: { relations: list.map((l) => `${l.relation}:${l.sku}x${l.quantity}`) } })
    return alsoNeededFor(part.id, null, t)
  })
}

/** What the quote's parts need beside them that is not on it yet and fits its vehicle, once per part. */
export async function quoteAlsoNeeded(quoteId: number, vehicleId: number | null): Promise<(AlsoNeeded & { forSku: string })[]> {
  const lines = await QuoteLine.findAll({ where: { quoteId, kind: 'part' }, attributes: ['partId', 'sku'], order: [['position', 'ASC'], ['id', 'ASC']] })
  const onQuote = new Set(lines.map((l) => l.sku))
  const out: (AlsoNeeded & { forSku: string })[] = []
  for (const l of lines.filter((x) => x.partId)) {
    for (const a of await alsoNeededFor(l.partId!, vehicleId)) {
      if (a.fits === false || onQuote.has(a.sku) || out.some((o) => o.sku === a.sku)) continue
      out.push({ ...a, forSku: l.sku ?? '' })
    }
  }
  return out
}

/**
 * From wear verdicts to catalogue parts: for each part type an inspection recommends per axle (and side, for parts
 * made left and right), the parts the catalogue lists as fitting that vehicle there, honouring the option answers
 * given. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { Fitment, Part, VehicleOption, type Vehicle } from '../models/catalogue'
import type { RecommendedPart } from '../../shared/utils/brake'
import { matchQualifiers, sameValue } from '../../shared/utils/catalogue/qualifiers'
import { CATALOGUE_TYPE_OF, type InspectionRecommendation, type RecommendedCataloguePart } from '../../shared/schemas/inspections'

/** Short vehicle name for lists: "Make Model generation (2015-2019)". */
export function vehicleLabel(v: Pick<Vehicle, 'make' | 'model' | 'generation' | 'yearFrom' | 'yearTo'>): string {
  const years = v.yearTo ? `${v.yearFrom}–${v.yearTo}` : `${v.yearFrom}–`
  return [v.make, v.model, v.generation].filter(Boolean).join(' ') + ` (${years})`
}

/**
 * Does a qualified row (fitment or OE brake) apply given the answers (shared/utils/catalogue/qualifiers.ts)? An
 * unanswered qualifier keeps it, with the condition spelt out ("if Front disc is 300 mm") so the technician can
 * check at the car; `condition` is null when nothing is left open.
 */
export function qualifierCondition(
  qualifiers: Record<string, string> | null | undefined,
  answers: Record<string, string>,
  options: readonly Pick<VehicleOption, 'key' | 'label' | 'values'>[] = [],
): { fits: boolean; condition: string | null } {
  const q = qualifiers ?? {}
  const match = matchQualifiers(q, answers)
  if (match === 'excluded') return { fits: false, condition: null }
  if (match === 'fits') return { fits: true, condition: null }
  const open = Object.entries(q)
    .filter(([key]) => answers[key] === undefined)
    .map(([key, value]) => {
      const option = options.find((o) => o.key === key)
      const valueLabel = option?.values.find((v) => sameValue(v.value, value))?.label ?? value
      return `${option?.label ?? key} is ${valueLabel}`
    })
  return { fits: true, condition: `if ${open.join(' and ')}` }
}

/** Fitment rows for the whole vehicle (axle "all": master cylinders, fluid) count for every axle. */
const WHOLE_VEHICLE_AXLES = new Set(['all'])

/**
 * The catalogue parts for each recommended part type. Active parts only; parts whose fitment is certain come
 * before those that depend on an unanswered option; then by SKU.
 */
export async function cataloguePartsFor(
  vehicleId: number,
  recommended: readonly RecommendedPart[],
  answers: Record<string, string>,
  transaction?: Transaction,
): Promise<InspectionRecommendation[]> {
  if (recommended.length === 0) return []
  const types = [...new Set(recommended.map((r) => CATALOGUE_TYPE_OF[r.partType]))]
  const [fitments, options] = await Promise.all([
    Fitment.findAll({
      where: { vehicleId },
      include: [{ model: Part, as: 'part', required: true, where: { type: { [Op.in]: types }, status: 'active' } }],
      transaction,
    }),
    VehicleOption.findAll({ where: { vehicleId }, transaction }),
  ])

  return recommended.map((rec) => {
    const catalogueType = CATALOGUE_TYPE_OF[rec.partType]
    const parts: RecommendedCataloguePart[] = []
    for (const f of fitments) {
      const part = (f as Fitment & { part: Part }).part
      if (part.type !== catalogueType) continue
      const axle = String(f.axle ?? '').toLowerCase()
      if (rec.axle !== 'system' && axle !== rec.axle && !WHOLE_VEHICLE_AXLES.has(axle)) continue
      // a part judged at one wheel (a hose, a caliper) is that side's part, or one made for either side
      if (rec.side && f.side && f.side !== 'pair' && f.side !== rec.side) continue
      const match = qualifierCondition(f.qualifiers, answers, options)
      if (!match.fits) continue
      if (parts.some((p) => p.partId === part.id)) continue
      parts.push({
        partId: part.id, sku: part.sku, description: part.description, type: part.type, productLine: part.productLine ?? '',
        axle: f.axle, side: f.side ?? 'pair', quantity: f.quantity ?? 1, note: f.note ?? '', condition: match.condition,
      })
    }
    parts.sort((a, b) => Number(a.condition !== null) - Number(b.condition !== null) || a.sku.localeCompare(b.sku))
    return { ...rec, catalogueType, parts }
  })
}

/**
 * From an inspection to a quote: the vehicle and inspection checked as this garage's own, the findings in plain
 * words for the owner, and each recommended part type turned into a line (required for a fail verdict, advised
 * for an advise one, the finding as its reason), with what was skipped and why.
 */
import type { Transaction } from 'sequelize'
import type { Organisation } from '../../models/accounts'
import { Vehicle } from '../../models/catalogue'
import { Inspection } from '../../models/inspections'
import type { Quote, QuoteLine } from '../../models/quotes'
import { vehicleLabel } from '../inspections'
import { plainFinding } from '../../../shared/utils/quote-wording'
import type { InspectionFinding } from '../../../shared/types/quotes'
import { invalidInput, isDomainError } from '../errors'
import { addLine } from './lines'
import { linesOf } from './rows'
import { addGuideLabour } from '../jobs/guide-labour'

export interface Skipped { index: number; what: string; why: string }

/** The catalogue vehicle as the quote records it (422 on `vehicleId` when it is not in the catalogue). */
export async function vehicleSnapshot(vehicleId: number, t?: Transaction): Promise<{ id: number; label: string }> {
  const v = await Vehicle.findByPk(vehicleId, { attributes: ['id', 'make', 'model', 'generation', 'yearFrom', 'yearTo'], transaction: t })
  if (!v) throw invalidInput({ vehicleId: 'That vehicle is not in the catalogue.' })
  return { id: v.id, label: vehicleLabel(v) }
}

/** One of the garage's inspections of this vehicle (422 on `inspectionId` otherwise, never saying whose it is). */
export async function inspectionOfVehicle(organisationId: number, inspectionId: number, vehicleId: number | null): Promise<Inspection> {
  const inspection = await Inspection.findOne({ where: { id: inspectionId, organisationId } })
  if (!inspection) throw invalidInput({ inspectionId: 'No such inspection at this garage.' })
  if (inspection.vehicleId !== vehicleId) throw invalidInput({ inspectionId: 'That inspection is of another vehicle.' })
  return inspection
}

/** The inspection's findings in plain words: every check that is not ok, worst first. */
export function findingsOf(inspection: Pick<Inspection, 'result'>): InspectionFinding[] {
  const items = inspection.result?.items ?? []
  return items.filter((i) => i.verdict !== 'ok')
    .map((i) => ({ verdict: i.verdict as 'advise' | 'fail', text: plainFinding(i) }))
    .sort((a, b) => (a.verdict === b.verdict ? 0 : a.verdict === 'fail' ? -1 : 1))
}

/** Turns an inspection's recommendations into required (fail) and advised lines; returns what was skipped and why. */
export async function addInspectionLines(
  t: Transaction, q: Quote, org: Organisation, inspection: Inspection, choices: { index: number; sku: string | null }[] = [],
): Promise<{ added: QuoteLine[]; skipped: Skipped[] }> {
  const added: QuoteLine[] = []
  const skipped: Skipped[] = []
  const existing = await linesOf(q.id, t)
  const recs = inspection.recommendedParts ?? []
  // the owner reads the reasons: in plain words where the check has them
  const plain = new Map((inspection.result?.items ?? []).map((i) => [i.message, plainFinding(i)]))
  for (const [index, rec] of recs.entries()) {
    const where = rec.axle === 'system' ? 'Brake system' : `${rec.axle[0]!.toUpperCase()}${rec.axle.slice(1)} ${rec.side ?? 'axle'}`
    const what = `${where}: ${rec.partType.replace('-', ' ')}`
    const choice = choices.find((c) => c.index === index)
    if (choice && choice.sku === null) { skipped.push({ index, what, why: 'left out by choice' }); continue }
    const pick = choice?.sku
      ? rec.parts.find((p) => p.sku === choice.sku) ?? { sku: choice.sku, quantity: 1, condition: null }
      : rec.parts.find((p) => p.condition === null) ?? rec.parts[0]
    if (!pick) { skipped.push({ index, what, why: 'no catalogue part fits this vehicle' }); continue }
    if (existing.some((l) => l.kind === 'part' && l.sku === pick.sku) || added.some((l) => l.sku === pick.sku)) {
      skipped.push({ index, what, why: `${pick.sku} is already on the quote` })
      continue
    }
    try {
      added.push(...await addLine(t, q, org, {
        kind: 'part', sku: pick.sku, quantity: Math.max(1, pick.quantity ?? 1),
        recommendation: rec.verdict === 'fail' ? 'required' : 'advised',
        reason: [...new Set(rec.reasons.map((r) => plain.get(r) ?? r))].join(' '),
      }))
    } catch (err) {
      if (isDomainError(err) && err.kind === 'invalid') { skipped.push({ index, what, why: Object.values(err.fields)[0] ?? err.message }); continue }
      throw err
    }
  }
  // the labour for the parts, from the labour guide (overlaps taken off)
  if (added.length) await addGuideLabour(t, q, org)
  return { added, skipped }
}

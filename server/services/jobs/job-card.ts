/**
 * The job card of an approved quote: the approved lines by wheel (declined ones listed as declined by the
 * owner), the vehicle's torque figures, fluid grade and capacity, the bleeding sequence for its circuit split, the
 * checks, and the technician's sign-off with time and odometer. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { User } from '../../models/accounts'
import { Fitment, Vehicle } from '../../models/catalogue'
import { JobCard, OwnerInvoice, VehicleJobData } from '../../models/jobs'
import type { Quote, QuoteLine } from '../../models/quotes'
import { parseOdometer } from '../garage-vehicles/odometer'
import { CIRCUIT_SPLIT_LABELS, vehicleBleedingSequence, type CircuitSplit } from '../../../shared/utils/jobs/bleeding'
import { JOB_CARD_CAUTION, JOB_CHECKS } from '../../../shared/utils/jobs/checks'
import { effectiveQuoteStatus } from '../../../shared/utils/quote-states'
import type { JobCardLine, JobCardView, JobCardWheelGroup } from '../../../shared/types/jobs'
import { conflict } from '../errors'
import { quoteReference } from '../quotes/references'
import { hoursOf, isDecidable, linesOf } from '../quotes/rows'

const WHERE_LABELS: Record<string, string> = {
  'front-left': 'Front left wheel', 'front-right': 'Front right wheel', front: 'Front axle, both wheels',
  'rear-left': 'Rear left wheel', 'rear-right': 'Rear right wheel', rear: 'Rear axle, both wheels',
  all: 'Whole brake system', labour: 'Labour and other work', other: 'Other parts',
}
const WHERE_ORDER = Object.keys(WHERE_LABELS)

/** 409 unless the quote is the owner's approved (wholly or partly) and still the latest revision. */
export function assertApproved(q: Pick<Quote, 'status' | 'expiresAt'>): void {
  const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
  if (status === 'superseded') throw conflict('This revision has been replaced: open the job card of the latest one.')
  if (status !== 'approved' && status !== 'partly_approved') throw conflict('The owner has not approved this quote yet: a job card comes from approved work.')
}

function cardLine(l: QuoteLine, decision: JobCardLine['decision']): JobCardLine {
  return { id: l.id, kind: l.kind, description: l.description, sku: l.sku ?? null, quantity: l.quantity, hours: hoursOf(l), reason: l.reason ?? null, decision }
}

async function groupsOf(q: Quote, approved: QuoteLine[], t?: Transaction): Promise<JobCardWheelGroup[]> {
  const partIds = approved.filter((l) => l.partId).map((l) => l.partId!)
  const fits = q.vehicleId && partIds.length
    ? await Fitment.findAll({ where: { vehicleId: q.vehicleId, partId: { [Op.in]: partIds } }, attributes: ['partId', 'axle', 'side'], transaction: t })
    : []
  const groups = new Map<string, JobCardLine[]>()
  for (const l of approved) {
    const f = fits.find((x) => x.partId === l.partId)
    const where = l.kind !== 'part' ? 'labour' : !f ? 'other' : f.axle === 'all' ? 'all' : f.side === 'pair' ? f.axle : `${f.axle}-${f.side}`
    groups.set(where, [...(groups.get(where) ?? []), cardLine(l, 'approved')])
  }
  return [...groups].sort(([a], [b]) => WHERE_ORDER.indexOf(a) - WHERE_ORDER.indexOf(b))
    .map(([where, lines]) => ({ where, label: WHERE_LABELS[where] ?? where, lines }))
}

/** The job card of one of the garage's quotes (409 before the owner approved). */
export async function jobCardOf(q: Quote, t?: Transaction): Promise<JobCardView> {
  assertApproved(q)
  const [lines, vehicle, data, card, invoice] = await Promise.all([
    linesOf(q.id, t),
    q.vehicleId ? Vehicle.findByPk(q.vehicleId, { attributes: ['id', 'fluidGrade', 'circuitSplit', 'steeringSide'], transaction: t }) : null,
    q.vehicleId ? VehicleJobData.findByPk(q.vehicleId, { transaction: t }) : null,
    JobCard.findOne({ where: { quoteId: q.id, organisationId: q.organisationId }, transaction: t }),
    OwnerInvoice.findOne({ where: { quoteId: q.id, organisationId: q.organisationId }, attributes: ['id'], transaction: t }),
  ])
  const work = lines.filter(isDecidable)
  const approved = work.filter((l) => l.ownerDecision === 'approved')
  const signer = card?.signedOffByUserId ? await User.findByPk(card.signedOffByUserId, { attributes: ['name'], transaction: t }) : null
  const done = new Set((card?.checks ?? []).filter((c) => c.done).map((c) => c.key))
  const split = (vehicle?.circuitSplit ?? null) as CircuitSplit | null
  return {
    quoteId: q.id, reference: quoteReference(q), vehicle: q.vehicleLabel, registration: q.registration ?? '', odometerAtQuote: q.odometer ?? '', odometerUnit: parseOdometer(q.odometer ?? '')?.unit ?? 'mi',
    groups: await groupsOf(q, approved, t),
    declined: work.filter((l) => l.ownerDecision === 'declined').map((l) => cardLine(l, 'declined')),
    torques: data?.torques ?? [],
    fluid: { grade: vehicle?.fluidGrade ?? '', capacityMl: data?.fluidCapacityMl ?? null },
    circuitSplit: split,
    circuitSplitLabel: split ? CIRCUIT_SPLIT_LABELS[split] : '',
    steeringSide: vehicle?.steeringSide ?? null,
    bleedingSequence: vehicleBleedingSequence(split, vehicle?.steeringSide ?? null),
    checks: JOB_CHECKS.map((c) => ({ key: c.key, label: c.label, done: done.has(c.key) })),
    signedOff: card?.signedOffAt ? { by: signer?.name ?? '', at: card.signedOffAt.toISOString(), odometer: card.odometer ?? null } : null,
    invoiceId: invoice?.id ?? null,
    caution: JOB_CARD_CAUTION,
  }
}

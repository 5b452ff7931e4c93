/**
 * The technician's sign-off: every check ticked, the odometer read at the end (not below the reading the car
 * came in with), once per job; recorded with who and when, the reading noted in the car's history, audited.
 */
import { JobCard } from '../../models/jobs'
import type { Quote } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { JOB_CHECKS } from '../../../shared/utils/jobs/checks'
import type { JobCompleteInput } from '../../../shared/schemas/jobs'
import type { JobCardView } from '../../../shared/types/jobs'
import { conflict, invalidInput } from '../errors'
import { addReading, parseOdometer } from '../garage-vehicles/odometer'
import { assertApproved, jobCardOf } from './job-card'

export async function signOffJob(q: Quote, actor: { userId: number; organisationId: number }, input: JobCompleteInput): Promise<JobCardView> {
  assertApproved(q)
  const ticked = new Set(input.checks)
  const missing = JOB_CHECKS.filter((c) => !ticked.has(c.key))
  if (missing.length) throw invalidInput({ checks: `Tick every check before signing off: ${missing.map((c) => c.label.split(';')[0]!.split(':')[0]).join(', ')}.` })
  const before = parseOdometer(q.odometer ?? '')
  if (before && input.odometer < before.reading) {
    throw invalidInput({ odometer: `The odometer read ${before.reading} ${before.unit} when the car came in; the reading now cannot be lower.` })
  }
  await withWrite(async (t) => {
    const existing = await JobCard.findOne({ where: { quoteId: q.id, organisationId: q.organisationId }, transaction: t })
    if (existing?.signedOffAt) throw conflict('This job has already been signed off.')
    const values = {
      checks: JOB_CHECKS.map((c) => ({ key: c.key, label: c.label, done: true })), odometer: input.odometer,
      signedOffByUserId: actor.userId, signedOffAt: new Date(),
    }
    const card = existing ? await existing.update(values, { transaction: t }) : await JobCard.create({ quoteId: q.id, organisationId: q.organisationId, ...values }, { transaction: t })
    if (q.garageVehicleId) await addReading(t, q.garageVehicleId, { reading: input.odometer, unit: before?.unit ?? 'mi' }, 'recorded')
    await audit(t, { actorUserId: actor.userId, organisationId: q.organisationId, action: 'job.signOff', entity: 'quote', entityId: q.id, changes: { jobCard: card.id, odometer: input.odometer } })
  })
  return jobCardOf(q)
}

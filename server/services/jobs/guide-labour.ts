/**
 * Labour lines from the labour guide for the parts on a quote: each part line calls for an operation on its
 * axle (shared/utils/jobs/labour.ts), the overlap rule takes off what two operations share, and each operation
 * left with hours becomes a labour line holding the guide's hours (the manager may change the hours; the quote
 * then says they differ from the guide). Operations already on the quote are not added again.
 */
import { Op, type Transaction } from 'sequelize'
import type { Organisation } from '../../models/accounts'
import { Fitment } from '../../models/catalogue'
import { QuoteLine, type Quote } from '../../models/quotes'
import { LABOUR_OPERATION_LABELS, operationFor, overlapHours, type JobOperation } from '../../../shared/utils/jobs/labour'
import type { AxleName } from '../../../shared/types/axles'
import { addLine } from '../quotes/lines'
import { guideFor } from './labour-guide'

/** Adds the guide's labour for the quote's part lines; returns the labour lines added. */
export async function addGuideLabour(t: Transaction, q: Quote, org: Organisation): Promise<QuoteLine[]> {
  if (!q.vehicleId) return []
  const lines = await QuoteLine.findAll({ where: { quoteId: q.id, kind: { [Op.in]: ['part', 'labour'] } }, transaction: t })
  const parts = lines.filter((l) => l.kind === 'part' && l.partId)
  const fitments = await Fitment.findAll({ where: { vehicleId: q.vehicleId, partId: { [Op.in]: parts.map((l) => l.partId!) } }, attributes: ['partId', 'axle'], transaction: t })
  const ops: (JobOperation & { required: boolean })[] = []
  for (const l of parts) {
    const axle = (fitments.find((f) => f.partId === l.partId)?.axle ?? null) as AxleName | 'all' | null
    const operation = operationFor(l.partType ?? '', axle)
    if (operation) ops.push({ operation, count: l.quantity, required: l.recommendation === 'required' })
  }
  const done = new Set(lines.filter((l) => l.kind === 'labour' && l.labourOperation).map((l) => l.labourOperation))
  const steps = overlapHours(ops, await guideFor(q.vehicleId, org.id, t))
  const added: QuoteLine[] = []
  for (const s of steps) {
    if (s.hundredths <= 0 || done.has(s.operation)) continue
    const label = LABOUR_OPERATION_LABELS[s.operation].replace(' (each)', s.count > 1 ? ` ×${s.count}` : '')
    added.push(...await addLine(t, q, org, {
      kind: 'labour', hours: s.hundredths / 100, operation: s.operation, guideHundredths: s.hundredths,
      description: `Labour: ${label}${s.why.length ? ` (less ${s.lessHundredths / 100} h: ${s.why.join('; ')})` : ''}`,
      recommendation: ops.some((o) => o.operation === s.operation && o.required) ? 'required' : 'advised',
    }))
  }
  return added
}

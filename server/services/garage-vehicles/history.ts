/**
 * A garage vehicle's history, newest first: its inspections (with the verdict), quotes (what the owner approved or
 * declined, line by line; replaced revisions only when the owner had decided them), the orders made from those
 * quotes and the odometer readings. The whole history of one car is small, so it is gathered and then paged.
 * Plain Node.
 */
import { Op } from 'sequelize'
import { User } from '../../models/accounts'
import { Inspection } from '../../models/inspections'
import { Order } from '../../models/orders'
import { Quote, QuoteLine } from '../../models/quotes'
import { OdometerReading } from '../../models/garage-vehicles'
import { OwnerInvoice } from '../../models/jobs'
import { ownerInvoiceReference } from '../owner-invoices/numbering'
import { pageOfList } from '../../utils/page'
import { quoteTotals } from '../../../shared/utils/quote-totals'
import type { PageQuery } from '../../../shared/schemas/page'
import type { HistoryEntry } from '../../../shared/types/garage-vehicles'
import { orderReference } from '../../../shared/types/orders'
import type { Page } from '../../../shared/types/page'
import { quoteReference } from '../quotes/references'
import { isDecidable, totalsInput } from '../quotes/rows'

const iso = (d: Date | string) => new Date(d).toISOString()

async function quoteEntries(organisationId: number, garageVehicleId: number): Promise<{ entries: HistoryEntry[]; ids: number[] }> {
  const quotes = await Quote.findAll({
    where: { organisationId, garageVehicleId, [Op.or]: [{ status: { [Op.ne]: 'superseded' } }, { decidedAt: { [Op.ne]: null } }] },
  })
  const lines = quotes.length ? await QuoteLine.findAll({ where: { quoteId: quotes.map((q) => q.id) }, order: [['position', 'ASC'], ['id', 'ASC']] }) : []
  const entries = quotes.map((q): HistoryEntry => {
    const own = lines.filter((l) => l.quoteId === q.id)
    return {
      kind: 'quote', id: q.id, at: iso(q.decidedAt ?? q.sentAt ?? q.createdAt), title: `Quote ${quoteReference(q)}`, status: q.status,
      grossMinor: quoteTotals(totalsInput(own)).grossMinor,
      lines: own.filter(isDecidable).map((l) => ({ description: l.description, recommendation: l.recommendation ?? null, decision: l.ownerDecision ?? null })),
    }
  })
  return { entries, ids: quotes.map((q) => q.id) }
}

export async function vehicleHistory(organisationId: number, garageVehicleId: number, query: PageQuery): Promise<Page<HistoryEntry>> {
  const [inspections, quotes, readings] = await Promise.all([
    Inspection.findAll({ where: { organisationId, garageVehicleId }, include: [{ model: User, as: 'author', attributes: ['id', 'name'] }] }),
    quoteEntries(organisationId, garageVehicleId),
    OdometerReading.findAll({ where: { garageVehicleId } }),
  ])
  const [orders, invoices] = quotes.ids.length
    ? await Promise.all([Order.findAll({ where: { organisationId, quoteId: quotes.ids } }), OwnerInvoice.findAll({ where: { organisationId, quoteId: quotes.ids } })])
    : [[], []]
  const all: HistoryEntry[] = [
    ...inspections.map((i): HistoryEntry => ({
      kind: 'inspection', id: i.id, at: iso(i.createdAt), title: `Inspection ${i.id}`, overall: i.overall, odometer: i.odometer ?? '', author: i.author?.name ?? '',
    })),
    ...quotes.entries,
    ...orders.map((o): HistoryEntry => ({ kind: 'order', id: o.id, at: iso(o.createdAt), title: `Order ${orderReference(o.id)}`, status: o.status, totalMinor: o.totalMinor })),
    ...invoices.map((i): HistoryEntry => ({
      kind: 'invoice', id: i.id, at: iso(i.issuedAt), title: `Invoice ${ownerInvoiceReference(i.number)}`, quoteId: i.quoteId, grossMinor: i.grossMinor,
    })),
    ...readings.map((r): HistoryEntry => ({
      kind: 'odometer', id: r.id, at: `${r.readOn}T12:00:00.000Z`, title: 'Odometer reading', reading: r.reading, unit: r.unit, source: r.source,
    })),
  ]
  all.sort((a, b) => b.at.localeCompare(a.at) || b.id - a.id)
  return pageOfList(query, all)
}

/** Returns as the routes answer them (shared/types/returns.ts), and finding one the caller may see. */
import type { Transaction, WhereOptions } from 'sequelize'
import { Organisation } from '../../models/accounts'
import { OrderLine } from '../../models/orders'
import { IssuedDocument, PartReturn, PartReturnPhoto } from '../../models/counter'
import { orderReference } from '../../../shared/types/orders'
import { RETURN_REASON_LABELS, RETURN_STATUS_LABELS, returnReference, type ReturnView } from '../../../shared/types/returns'
import { notFound } from '../errors'

export const returnIncludes = (withGarage: boolean) => [
  { model: OrderLine, as: 'line', attributes: ['id', 'sku', 'description', 'partId', 'quantity'] },
  { model: PartReturnPhoto, as: 'photos', attributes: ['id', 'originalName'] },
  { model: IssuedDocument, as: 'creditNote', attributes: ['id', 'reference'] },
  ...(withGarage ? [{ model: Organisation, as: 'organisation', attributes: ['id', 'name'] }] : []),
]

export function returnView(r: PartReturn): ReturnView {
  return {
    id: r.id, reference: returnReference(r.id), orderId: r.orderId, orderReference: orderReference(r.orderId), orderLineId: r.orderLineId,
    sku: r.line?.sku ?? '', description: r.line?.description ?? '', quantity: r.quantity,
    reason: r.reason, reasonLabel: RETURN_REASON_LABELS[r.reason], warranty: r.reason === 'faulty', note: r.note ?? '',
    fittedOn: r.fittedOn ?? null, mileage: r.mileage ?? null, fault: r.fault ?? null,
    photos: [...(r.photos ?? [])].sort((a, b) => a.id - b.id).map((p) => ({ id: p.id, name: p.originalName })),
    status: r.status, statusLabel: RETURN_STATUS_LABELS[r.status], acceptedQuantity: r.acceptedQuantity ?? null,
    decisionReason: r.decisionReason ?? null, restockingBp: r.restockingBp ?? 0, creditedMinor: r.creditedMinor ?? null,
    creditNote: r.creditNote ? { id: r.creditNote.id, reference: r.creditNote.reference } : null,
    refundPending: !!r.refundPending, requestedAt: r.createdAt.toISOString(), decidedAt: r.decidedAt?.toISOString() ?? null,
    ...(r.organisation ? { garage: { id: r.organisation.id, name: r.organisation.name } } : {}),
  }
}

/** A return the caller may see: `organisationId` null for distributor staff, else the garage's own (404 otherwise). */
export async function findVisibleReturn(id: number, organisationId: number | null, t?: Transaction): Promise<PartReturn> {
  const where: WhereOptions<PartReturn> = organisationId === null ? { id } : { id, organisationId }
  const r = await PartReturn.findOne({ where, include: returnIncludes(organisationId === null), transaction: t })
  if (!r) throw notFound('Return')
  return r
}

/**
 * Parts a garage sends back: a wrong part ordered, a part not needed, or a faulty one (a warranty claim the
 * distributor settles). The counter receives the goods and accepts all, part or none; what is accepted is
 * credited on a credit note that references the invoice that charged it.
 */

export const RETURN_REASONS = ['wrong_part', 'not_needed', 'faulty'] as const
export type ReturnReason = (typeof RETURN_REASONS)[number]

export const RETURN_REASON_LABELS: Record<ReturnReason, string> = {
  wrong_part: 'Wrong part ordered',
  not_needed: 'Not needed',
  faulty: 'Faulty or damaged (warranty claim)',
}

export const RETURN_STATUSES = ['requested', 'accepted', 'part_accepted', 'rejected'] as const
export type ReturnStatus = (typeof RETURN_STATUSES)[number]

export const RETURN_STATUS_LABELS: Record<ReturnStatus, string> = {
  requested: 'Waiting for the counter',
  accepted: 'Accepted and credited',
  part_accepted: 'Accepted in part and credited',
  rejected: 'Not accepted',
}

/** The reference people quote: RT-000012. */
export function returnReference(id: number): string {
  return `RT-${String(id).padStart(6, '0')}`
}

export interface ReturnView {
  id: number
  reference: string
  orderId: number
  orderReference: string
  orderLineId: number
  sku: string
  description: string
  quantity: number
  reason: ReturnReason
  reasonLabel: string
  /** faulty parts are warranty claims */
  warranty: boolean
  note: string
  fittedOn: string | null
  mileage: number | null
  fault: string | null
  photos: { id: number; name: string }[]
  status: ReturnStatus
  statusLabel: string
  acceptedQuantity: number | null
  decisionReason: string | null
  /** the restocking charge that applies (basis points of the credited net); 0 when none */
  restockingBp: number
  /** the gross amount credited (after any restocking charge) */
  creditedMinor: number | null
  creditNote: { id: number; reference: string } | null
  refundPending: boolean
  requestedAt: string
  decidedAt: string | null
  /** distributor views only */
  garage?: { id: number; name: string }
}

/** What a garage may send back from one sent line (the return form). */
export interface ReturnableLine {
  orderLineId: number
  sku: string
  description: string
  returnableQuantity: number
  dispatchedAt: string
  /** the last day a wrong or unneeded part may come back, and a faulty one */
  returnBy: string
  warrantyBy: string
  /** from this day a part not needed carries the restocking charge */
  restockingFrom: string
  restockingBp: number
}

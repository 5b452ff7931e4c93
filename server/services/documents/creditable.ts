/**
 * What is left to credit on an invoice line: the invoiced quantity, net and tax less what earlier credit notes
 * against the same invoice took. A credit of part of a line takes its share of the line's tax (rounded half
 * away from zero, never more than is left); the credit that takes the last units takes exactly what tax is left,
 * so the credit notes against an invoice add up to no more than it charged, to the penny. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { DocumentLine, IssuedDocument } from '../../models/counter'
import type { DocumentLineKind, DocumentLineView } from '../../../shared/types/documents'
import { divRoundHalfUp } from '../../../shared/utils/money'
import { conflict } from '../errors'

/** A line of a credit note, and the order line it credits. */
export interface CreditPiece extends DocumentLineView {
  orderLineId: number
}

export interface Creditable { invoiced: DocumentLine; quantity: number; netMinor: number; taxMinor: number }

/** The invoice line of this kind for an order line, with what is still creditable on it; null when it never charged one. */
export async function creditable(t: Transaction, invoiceId: number, orderLineId: number, kind: DocumentLineKind): Promise<Creditable | null> {
  const invoiced = await DocumentLine.findOne({ where: { documentId: invoiceId, orderLineId, kind }, transaction: t })
  if (!invoiced) return null
  const notes = await IssuedDocument.findAll({ where: { invoiceId }, attributes: ['id'], transaction: t })
  const credited = notes.length
    ? await DocumentLine.findAll({ where: { documentId: { [Op.in]: notes.map((n) => n.id) }, orderLineId, kind }, transaction: t })
    : []
  const sum = (k: 'quantity' | 'netMinor' | 'taxMinor') => credited.reduce((s, l) => s + l[k], 0)
  return { invoiced, quantity: invoiced.quantity - sum('quantity'), netMinor: invoiced.netMinor - sum('netMinor'), taxMinor: invoiced.taxMinor - sum('taxMinor') }
}

/** The credit for `quantity` units of what is left (409 when more than is left is asked for). */
export function creditOf(left: Creditable, quantity: number): CreditPiece {
  const { invoiced } = left
  if (quantity > left.quantity) {
    throw conflict(`Only ${left.quantity} of ${invoiced.sku || invoiced.description} can still be credited against this invoice.`)
  }
  const last = quantity === left.quantity
  const netMinor = last ? left.netMinor : Math.min(left.netMinor, invoiced.unitMinor * quantity)
  const share = divRoundHalfUp(invoiced.taxMinor * quantity, invoiced.quantity)
  return {
    orderLineId: invoiced.orderLineId!, kind: invoiced.kind, sku: invoiced.sku, description: invoiced.description, quantity,
    unitMinor: invoiced.unitMinor, netMinor, taxBp: invoiced.taxBp, taxMinor: last ? left.taxMinor : Math.min(left.taxMinor, share),
  }
}

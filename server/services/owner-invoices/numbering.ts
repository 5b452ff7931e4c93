/**
 * A garage's own invoice numbers: one series per garage, 1, 2, 3, ... with no gaps. The number is taken inside
 * the write transaction (IMMEDIATE: one writer at a time) that writes the invoice, so a failed issue takes no
 * number and two managers issuing at once get consecutive numbers.
 */
import type { Transaction } from 'sequelize'
import { OwnerInvoiceSeries } from '../../models/jobs'

export async function nextOwnerInvoiceNumber(t: Transaction, organisationId: number): Promise<number> {
  const row = await OwnerInvoiceSeries.findByPk(organisationId, { transaction: t })
  if (!row) {
    await OwnerInvoiceSeries.create({ organisationId, lastNumber: 1 }, { transaction: t })
    return 1
  }
  await row.increment('lastNumber', { by: 1, transaction: t })
  await row.reload({ transaction: t })
  return row.lastNumber
}

/** How people read an owner invoice's number. */
export function ownerInvoiceReference(number: number): string {
  return `INV ${String(number).padStart(5, '0')}`
}

/**
 * The admin's choice of what an account payment pays: each chosen open item and how much of it, checked against
 * what is open before the payment (inside the payment's write transaction), and stored beside it. What the
 * payment does not allocate settles the oldest items first (ageing.ts). Plain Node.
 */
import type { Transaction } from 'sequelize'
import type { Organisation } from '../models/accounts'
import { PaymentAllocation } from '../models/money-owed'
import type { Formats } from '../../shared/utils/format'
import { openItemsOf } from './ageing'
import { owedLedger } from './owed-moves'
import { invalidInput } from './errors'

export interface AllocationInput { entryId: number; amountMinor: number }

/** 422 naming the field of each allocation that is not an open item of the garage or asks more than is open. */
export async function checkAllocations(t: Transaction, org: Organisation, wanted: readonly AllocationInput[], today: string, fmt: Formats): Promise<void> {
  if (!wanted.length) return
  const { moves, allocations } = await owedLedger(org.id, fmt.timeZone, t)
  const open = new Map(openItemsOf(moves, org.paymentDays ?? 0, today, allocations).map((i) => [i.entryId, i]))
  const fields: Record<string, string> = {}
  wanted.forEach((a, n) => {
    const item = open.get(a.entryId)
    if (!item) fields[`allocations.${n}.entryId`] = 'That is not an item this garage still owes.'
    else if (a.amountMinor > item.openMinor) fields[`allocations.${n}.amountMinor`] = `At most ${fmt.money(item.openMinor)} is still open on ${item.reference}.`
  })
  if (Object.keys(fields).length) throw invalidInput(fields, 'Some of the chosen items cannot take that payment.')
}

export async function saveAllocations(t: Transaction, organisationId: number, paymentEntryId: number, wanted: readonly AllocationInput[]): Promise<void> {
  if (!wanted.length) return
  await PaymentAllocation.bulkCreate(wanted.map((a) => ({ organisationId, paymentEntryId, chargeEntryId: a.entryId, amountMinor: a.amountMinor })), { transaction: t })
}

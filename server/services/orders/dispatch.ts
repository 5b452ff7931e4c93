/**
 * Sending what is picked: one dispatch, its invoice (numbered in the same transaction), the old units its exchange
 * parts are expected to bring back, and the order's state (dispatched, or part sent while lines are still to come).
 * When the counter sends without recording picks first, every line ready to go is taken as picked in full. Runs in
 * the caller's write transaction. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Organisation, type User } from '../../models/accounts'
import type { Order } from '../../models/orders'
import { Dispatch, type IssuedDocument } from '../../models/counter'
import type { Formats } from '../../../shared/utils/format'
import { conflict } from '../errors'
import { issueInvoice } from '../documents/issue'
import type { ViewClock } from './clock'
import { expectCores } from './ledger'
import { readiness } from './picking'

const STILL_TO_COME = ['reserved', 'waiting', 'picked']

export interface Sent { dispatch: Dispatch; invoice: IssuedDocument; lines: number; toFollow: number }

export async function dispatchPicked(t: Transaction, o: Order, actor: Pick<User, 'id'>, clock: ViewClock, fmt: Formats): Promise<Sent> {
  const lines = o.lines ?? []
  let picked = lines.filter((l) => l.state === 'picked')
  if (!picked.length) {
    const why = readiness(o, lines, clock.now, clock.timeZone, new Map())
    picked = lines.filter((l) => why.has(l.id) && why.get(l.id) === null)
    for (const l of picked) l.set({ pickedQuantity: l.quantity, state: 'picked' })
  }
  if (!picked.length) throw conflict('Nothing on this order is ready to send yet: see what each line waits for on the pick list.')
  const seq = (await Dispatch.count({ where: { orderId: o.id }, transaction: t })) + 1
  const dispatch = await Dispatch.create({
    orderId: o.id, seq, branchId: o.branchId, dispatchedAt: clock.now, dispatchedByUserId: actor.id,
  }, { transaction: t })
  for (const l of picked) {
    l.set({ state: 'dispatched', dispatchId: dispatch.id })
    await l.save({ transaction: t })
  }
  const garage = await Organisation.findByPk(o.organisationId, { attributes: ['paymentDays'], transaction: t })
  const invoice = await issueInvoice(t, o, dispatch, picked, o.branch?.name ?? '', fmt, garage?.paymentDays ?? 0)
  await expectCores(t, o, picked)
  const toFollow = lines.filter((l) => STILL_TO_COME.includes(l.state ?? 'reserved')).length
  o.status = toFollow ? 'part_dispatched' : 'dispatched'
  o.dispatchedAt = clock.now
  await o.save({ transaction: t })
  return { dispatch, invoice, lines: picked.length, toFollow }
}

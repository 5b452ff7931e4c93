/**
 * The admin's allocation of account payments, partial payments, and due dates running from the invoice's date.
 * Every figure is worked by hand below (pence); calendar days checked with GNU `date -u -d '2026-02-05 +30 days'`
 * (an outside calendar). Allocation first, then the rest oldest first: common practice for a trade account where a
 * remittance advice names the invoices paid and an unnamed payment clears the oldest debt.
 */
import { describe, expect, it } from 'vitest'
import { openItemsOf, type Allocation, type LedgerMove } from '../../../server/services/ageing'

const move = (id: number, day: string, amountMinor: number, extra: Partial<LedgerMove> = {}): LedgerMove =>
  ({ id, day, reference: `R${id}`, description: '', amountMinor, ...extra })
// A 100.00 (10 Jan), B 200.00 (10 Feb), C 300.00 (10 Mar); payment P 250.00 (20 Mar)
const ledger = [move(1, '2026-01-10', 10_000), move(2, '2026-02-10', 20_000), move(3, '2026-03-10', 30_000), move(4, '2026-03-20', -25_000)]
const open = (moves: LedgerMove[], allocations: Allocation[] = []) =>
  openItemsOf(moves, 30, '2026-03-25', allocations).map((i) => [i.reference, i.paidMinor, i.openMinor])

describe('allocation of a payment', () => {
  it('with nothing allocated settles the oldest first: 250.00 pays A (100.00) and 150.00 of B', () => {
    expect(open(ledger)).toEqual([['R2', 15_000, 5_000], ['R3', 0, 30_000]])
  })

  it('pays the item the admin names first, the rest the oldest first: 150.00 to C, 100.00 left clears A', () => {
    // 250.00 - 150.00 allocated = 100.00 pooled -> A (100.00) paid; B untouched; C 300.00 - 150.00 = 150.00 open
    expect(open(ledger, [{ paymentId: 4, chargeId: 3, amountMinor: 15_000 }])).toEqual([['R2', 0, 20_000], ['R3', 15_000, 15_000]])
  })

  it('caps an allocation at what the charge owes: 150.00 named for A (100.00) pays 100.00, the other 150.00 goes to B', () => {
    expect(open(ledger, [{ paymentId: 4, chargeId: 1, amountMinor: 15_000 }])).toEqual([['R2', 15_000, 5_000], ['R3', 0, 30_000]])
  })

  it('caps allocations at the payment: 200.00 to C and 200.00 to B from a 250.00 payment pay 200.00 and 50.00', () => {
    // C takes 200.00 (payment left 50.00), B takes the 50.00 left; nothing pooled, so A stays open
    expect(open(ledger, [{ paymentId: 4, chargeId: 3, amountMinor: 20_000 }, { paymentId: 4, chargeId: 2, amountMinor: 20_000 }]))
      .toEqual([['R1', 0, 10_000], ['R2', 5_000, 15_000], ['R3', 20_000, 10_000]])
  })

  it('adds partial payments: a second, unallocated 50.00 goes on the oldest item still open', () => {
    const more = [...ledger, move(5, '2026-03-22', -5_000)]
    // allocated 150.00 to C; pooled 100.00 + 50.00 = 150.00 -> A 100.00, B 50.00
    expect(open(more, [{ paymentId: 4, chargeId: 3, amountMinor: 15_000 }])).toEqual([['R2', 5_000, 15_000], ['R3', 15_000, 15_000]])
  })

  it('ignores an allocation that names no payment or no charge of the ledger', () => {
    expect(open(ledger, [{ paymentId: 99, chargeId: 3, amountMinor: 15_000 }, { paymentId: 4, chargeId: 99, amountMinor: 1 }])).toEqual(open(ledger))
  })
})

describe('due dates run from the invoice', () => {
  it('falls due 30 days after the invoice date, not the day the order was booked', () => {
    // booked 20 Jan, invoiced 5 Feb: 5 Feb + 30 days = 7 Mar (23 days left in February, 7 in March)
    const [item] = openItemsOf([move(1, '2026-01-20', 5_000, { dueFrom: '2026-02-05', invoice: 'INV-000007' })], 30, '2026-03-08')
    expect(item).toMatchObject({ bookedOn: '2026-01-20', invoice: 'INV-000007', invoicedOn: '2026-02-05', dueOn: '2026-03-07', daysOverdue: 1, bucket: 'd1_30' })
  })

  it('is open but not due while its order is not invoiced', () => {
    const [item] = openItemsOf([move(1, '2026-01-20', 5_000, { dueFrom: null })], 30, '2026-12-31')
    expect(item).toMatchObject({ invoice: null, dueOn: null, daysOverdue: 0, bucket: 'current', openMinor: 5_000 })
  })
})

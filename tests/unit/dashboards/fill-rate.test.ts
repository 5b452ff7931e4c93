/**
 * First-time fill rate: requested lines sent complete from the home branch in the first dispatch, over requested
 * lines sent (common practice: "lines shipped complete from the first location / lines shipped"). Each case is a
 * small order worked by hand.
 */
import { describe, expect, it } from 'vitest'
import { fillRateOf, type LinePiece } from '../../../server/services/dashboards/fill-rate'

const piece = (orderId: number, lineGroup: number, source: LinePiece['source'], state: LinePiece['state'], splitFromLineId: number | null = null): LinePiece =>
  ({ orderId, lineGroup, source, state, splitFromLineId })

describe('first-time fill rate', () => {
  it('counts a line sent whole from the shelf as filled', () => {
    expect(fillRateOf([piece(1, 0, 'home', 'dispatched')])).toEqual({ lines: 1, filled: 1 })
  })

  it('does not count a line split between the shelf and a transfer as filled, though both pieces went', () => {
    expect(fillRateOf([piece(1, 0, 'home', 'dispatched'), piece(1, 0, 'transfer', 'dispatched')])).toEqual({ lines: 1, filled: 0 })
  })

  it('does not count a line short-picked (the rest split off and sent later) as filled', () => {
    expect(fillRateOf([piece(1, 0, 'home', 'dispatched'), piece(1, 0, 'home', 'dispatched', 10)])).toEqual({ lines: 1, filled: 0 })
  })

  it('leaves out lines not finished yet (a back-order still waiting) and lines wholly cancelled', () => {
    expect(fillRateOf([
      piece(1, 0, 'home', 'dispatched'), piece(1, 0, 'back_order', 'waiting'), // waiting: not counted yet
      piece(1, 1, 'home', 'cancelled'), // nothing sent: not counted
      piece(2, 0, 'home', 'reserved'), // not sent yet
    ])).toEqual({ lines: 0, filled: 0 })
  })

  it('works a mixed week by hand: 4 lines sent, 3 filled first time = 75 %', () => {
    // order 1: line 0 whole from the shelf (filled), line 1 shelf + back-order both sent (not filled)
    // order 2: line 0 collected at the counter (filled), line 3 from the shelf (filled)
    const r = fillRateOf([
      piece(1, 0, 'home', 'dispatched'), piece(1, 1, 'home', 'dispatched'), piece(1, 1, 'back_order', 'dispatched'),
      piece(2, 0, 'collect', 'dispatched'), piece(2, 3, 'home', 'dispatched'),
    ])
    expect(r).toEqual({ lines: 4, filled: 3 })
    expect((r.filled / r.lines) * 100).toBe(75)
  })
})

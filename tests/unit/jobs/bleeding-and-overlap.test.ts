/**
 * The job card's bleeding sequence and the labour guide's overlap rule.
 * Sources: both are common practice (workshop manuals and brake-fluid makers' instructions bleed from the wheel
 * farthest from the master cylinder towards it, and a diagonal system one circuit at a time, rear wheel first;
 * labour guides count pads fitted with new discs inside the disc job). The expected values are worked by hand below.
 */
import { describe, expect, it } from 'vitest'
import { bleedingSequence, vehicleBleedingSequence } from '#shared/utils/jobs/bleeding'
import { jobOperations, operationFor, overlapHours } from '#shared/utils/jobs/labour'

describe('bleeding sequence (common practice: farthest wheel first)', () => {
  it('front/rear split, right-hand drive (master cylinder on the right): left rear, right rear, left front, right front', () => {
    // farthest from a right-hand master cylinder is the left rear; then the other rear; then the fronts, far one first
    expect(bleedingSequence('front-rear', 'right')).toEqual(['left rear', 'right rear', 'left front', 'right front'])
  })
  it('front/rear split, left-hand drive: right rear, left rear, right front, left front', () => {
    expect(bleedingSequence('front-rear', 'left')).toEqual(['right rear', 'left rear', 'right front', 'left front'])
  })
  it('diagonal split, right-hand drive: one circuit (left rear + right front), then the other (right rear + left front)', () => {
    // circuit 1 = left rear with its diagonal partner right front; it holds the farthest wheel, so it goes first, rear wheel first
    expect(bleedingSequence('diagonal', 'right')).toEqual(['left rear', 'right front', 'right rear', 'left front'])
  })
  it('diagonal split, left-hand drive: right rear, left front, left rear, right front', () => {
    expect(bleedingSequence('diagonal', 'left')).toEqual(['right rear', 'left front', 'left rear', 'right front'])
  })
  it('bleeds each wheel exactly once', () => {
    for (const split of ['front-rear', 'diagonal'] as const) for (const side of ['left', 'right'] as const) expect(new Set(bleedingSequence(split, side)).size).toBe(4)
  })
  it('follows the vehicle: left- and right-hand drive start at opposite rear wheels; an unrecorded side gives no order', () => {
    // left-hand drive: master cylinder on the left, so the right rear is farthest (common practice, as above)
    expect(vehicleBleedingSequence('front-rear', 'left')[0]).toBe('right rear')
    expect(vehicleBleedingSequence('front-rear', 'right')[0]).toBe('left rear')
    expect(vehicleBleedingSequence('diagonal', null)).toEqual([])
    expect(vehicleBleedingSequence(null, 'right')).toEqual([])
  })
})

describe('labour overlap (common practice)', () => {
  const guide = { front_pads: 80, front_discs_pads: 130, front_caliper: 90, fluid_flush: 60, rear_hose: 70 }

  it('discs and pads on the same axle are one job, not two', () => {
    // discs 1.30 h + pads 0.80 h would be 2.10 h; the pads are fitted within the disc job: 1.30 h + 0 h = 1.30 h
    const steps = overlapHours([{ operation: 'front_discs_pads', count: 1 }, { operation: 'front_pads', count: 1 }], guide)
    expect(steps.map((s) => [s.operation, s.hundredths])).toEqual([['front_pads', 0], ['front_discs_pads', 130]])
    expect(steps.reduce((s, x) => s + x.hundredths, 0)).toBe(130)
  })

  it('two calipers with the pads and a fluid flush: 0.30 h and 0.20 h less each', () => {
    // each caliper 0.90 h - 0.30 h (wheel and caliper already off for the pads) - 0.20 h (bled by the flush) = 0.40 h;
    // two calipers = 0.80 h; pads 0.80 h; flush 0.60 h; total 0.80 + 0.80 + 0.60 = 2.20 h
    const steps = overlapHours([
      { operation: 'front_pads', count: 1 }, { operation: 'front_caliper', count: 1 }, { operation: 'front_caliper', count: 1 }, { operation: 'fluid_flush', count: 1 },
    ], guide)
    expect(Object.fromEntries(steps.map((s) => [s.operation, s.hundredths]))).toEqual({ front_pads: 80, front_caliper: 80, fluid_flush: 60 })
    expect(steps.find((s) => s.operation === 'front_caliper')!.lessHundredths).toBe(100)
  })

  it('never takes an operation below zero, and counts a per-job operation once', () => {
    expect(overlapHours([{ operation: 'rear_hose', count: 2 }, { operation: 'fluid_flush', count: 1 }], { rear_hose: 15, fluid_flush: 60 })
      .find((s) => s.operation === 'rear_hose')!.hundredths).toBe(0)
    expect(jobOperations([{ operation: 'fluid_flush', count: 1 }, { operation: 'fluid_flush', count: 3 }])).toEqual([{ operation: 'fluid_flush', count: 1 }])
  })

  it('maps parts to operations by axle', () => {
    expect(operationFor('disc', 'front')).toBe('front_discs_pads')
    expect(operationFor('pad_set', 'rear')).toBe('rear_pads')
    expect(operationFor('fitting_kit', 'front')).toBeNull()
  })
})

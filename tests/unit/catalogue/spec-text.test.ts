import { describe, expect, it } from 'vitest'
import { keySpecs } from '../../../shared/utils/catalogue/spec-text'
import { PART_TYPES } from '../../../shared/schemas/catalogue/part-types'

describe('the one-line size summary of a part', () => {
  it('reads every given value with its unit', () => {
    // expected strings written by hand from the specs
    expect(keySpecs('disc', { diameterMm: 300, thicknessMm: 25, vented: true, minThicknessMm: 23 })).toBe('300 × 25 mm vented, min 23 mm')
    expect(keySpecs('pad_set', { widthMm: 133, heightMm: 55, thicknessMm: 19, frictionCode: 'FF' })).toBe('133 × 55 × 19 mm, FF')
    expect(keySpecs('caliper', { caliperType: 'floating', pistonCount: 2, pistonDiametersMm: [38, 42], condition: 'remanufactured' })).toBe('floating 2 × 38/42 mm, reman')
    expect(keySpecs('drum', { diameterMm: 228.6, maxDiameterMm: 230.6 })).toBe('228.6 mm (max 230.6 mm)')
    expect(keySpecs('master_cylinder', { boreMm: 22.22, tandem: true })).toBe('bore 22.22 mm tandem')
    expect(keySpecs('fluid', { grade: 'DOT 4', volumeMl: 1000 })).toBe('DOT 4 · 1000 ml')
  })

  it('never shows a unit without its number: a part a price file brought has no specifications yet', () => {
    for (const type of PART_TYPES) expect(keySpecs(type, {}), type).toBe('')
    expect(keySpecs('disc', { diameterMm: 264 })).toBe('264 mm')
    expect(keySpecs('disc', { vented: false, minThicknessMm: 10 })).toBe('solid, min 10 mm')
    expect(keySpecs('caliper', { pistonDiametersMm: [54] })).toBe('54 mm')
    expect(keySpecs('wheel_cylinder', { boreMm: 19.05 })).toBe('bore 19.05 mm')
  })
})

import { describe, it, expect } from 'vitest'
import {
  SAE_J866_TABLE,
  frictionCode,
  frictionLetter,
  frictionRange,
  nominalCoefficient,
  parseFrictionCode,
} from '#shared/utils/brake/friction-codes'

describe('SAE J866 Table 1', () => {
  it('letters and bounds', () => {
    // SAE J866, Table 1: C ≤ 0.15 < D ≤ 0.25 < E ≤ 0.35 < F ≤ 0.45 < G ≤ 0.55 < H; Z unclassified
    expect(SAE_J866_TABLE.map((r) => [r.letter, r.above, r.upTo])).toEqual([
      ['C', null, 0.15],
      ['D', 0.15, 0.25],
      ['E', 0.25, 0.35],
      ['F', 0.35, 0.45],
      ['G', 0.45, 0.55],
      ['H', 0.55, null],
      ['Z', null, null],
    ])
  })

  it('coefficient -> letter, boundary values take the lower letter', () => {
    // SAE J866, Table 1
    const cases: Array<[number, string]> = [
      [0.1, 'C'], [0.15, 'C'], [0.1500001, 'D'], [0.2, 'D'], [0.25, 'D'], [0.26, 'E'], [0.35, 'E'],
      [0.36, 'F'], [0.45, 'F'], [0.46, 'G'], [0.55, 'G'], [0.56, 'H'], [0.8, 'H'],
    ]
    for (const [mu, letter] of cases) expect(frictionLetter(mu), String(mu)).toBe(letter)
    // decimal arithmetic landing a hair over a boundary still counts as the boundary
    expect(frictionLetter(0.1 + 0.05)).toBe('C')
    expect(frictionLetter(0.3 + 0.15)).toBe('F')
  })

  it('no coefficient -> Z (unclassified)', () => {
    expect(frictionLetter(null)).toBe('Z')
    expect(frictionLetter(undefined)).toBe('Z')
    expect(frictionLetter(Number.NaN)).toBe('Z')
  })

  it('letter -> range, and back again for every range midpoint', () => {
    for (const letter of ['D', 'E', 'F', 'G']) {
      const mid = nominalCoefficient(letter)!
      expect(frictionLetter(mid)).toBe(letter)
      const r = frictionRange(letter)
      expect(frictionLetter(r.upTo!)).toBe(letter)
    }
    expect(nominalCoefficient('F')).toBe(0.4)
    expect(nominalCoefficient('c')).toBe(0.15)
    expect(nominalCoefficient('H')).toBe(0.55)
    expect(nominalCoefficient('Z')).toBeNull()
    expect(() => frictionRange('X')).toThrow(/not an SAE J866 friction letter/)
  })

  it('two-letter edge codes: normal then hot', () => {
    // SAE J866: first letter normal coefficient, second hot coefficient
    const c = parseFrictionCode('fe')
    expect(c.code).toBe('FE')
    expect(c.normal.letter).toBe('F')
    expect(c.hot.letter).toBe('E')
    expect(frictionCode(0.42, 0.33)).toBe('FE')
    expect(frictionCode(0.42, null)).toBe('FZ')
    expect(() => parseFrictionCode('F')).toThrow(/edge code/)
    expect(() => parseFrictionCode('FX')).toThrow(/edge code/)
  })
})

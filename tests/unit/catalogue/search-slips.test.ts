import { describe, expect, it } from 'vitest'
import { FITTING_RULES } from '#shared/utils/catalogue/fitting-rules'
import { planQuery } from '../../../server/services/catalogue/search-plan'
import { PartSearchIndex, type IndexInput } from '../../../server/services/catalogue/search-index'
import { isNeighbourKey, keyDistance, SLIP, substitutionCost } from '../../../server/services/catalogue/identifier-table'

// Part numbers handed out in sequence (common practice for a distributor's own SKUs): almost every number one
// slip away from a real one is another real part, so a slipped SKU usually matches some part exactly.
const pad = (n: number): IndexInput => ({
  id: n, sku: `SY-P${String(n).padStart(7, '0')}`, type: 'pad_set', productLine: 'Greywell Standard', status: 'active',
  oeNumbers: [], replaces: [], description: 'Front pad set 120 × 50 × 17.5 mm, for Veltra Pennon',
  specs: { axle: 'front', padShape: 'PS-10001', widthMm: 120, heightMm: 50, thicknessMm: 17.5, wearSensor: 'none', frictionCode: 'FF' },
})
function catalogue(count: number) {
  const ix = new PartSearchIndex(FITTING_RULES)
  ix.addAll(Array.from({ length: count }, (_, i) => pad(i + 1)))
  const run = (q: string) => ix.search(planQuery(q)).hits.map((h) => ({ sku: ix.info(h.id)!.sku, by: h.by }))
  return { run }
}

describe('part numbers typed with one slip', () => {
  const { run } = catalogue(3000)
  const rankOf = (q: string, meant: string) => run(q).findIndex((h) => h.sku === meant)

  it('lists the number typed first and the part meant on the same page when the slip makes another real number', () => {
    // meant SY-P0001924, typed with two digits swapped: SY-P0001294 exists too
    const hits = run('SY-P0001294')
    expect(hits[0]).toEqual({ sku: 'SY-P0001294', by: 'sku' })
    expect(rankOf('SY-P0001294', 'SY-P0001924')).toBeGreaterThan(0)
    expect(rankOf('SY-P0001294', 'SY-P0001924')).toBeLessThan(5) // swaps come first: at most 3 other swaps of 0001294 are real here
  })

  it('ranks a swap of neighbours, then a key next to the right one, above any other wrong digit', () => {
    // typed 0001255: 0001525 is the swap, 0001256 a neighbouring key (5 -> 6, top row and keypad), 0001259 a far one
    const swap = rankOf('SY-P0001255', 'SY-P0001525')
    const neighbour = rankOf('SY-P0001255', 'SY-P0001256')
    const far = rankOf('SY-P0001255', 'SY-P0001259')
    expect(swap).toBeGreaterThan(0)
    expect(swap).toBeLessThan(neighbour)
    expect(neighbour).toBeLessThan(far)
  })

  it('still finds a slipped number that is no real part, first', () => {
    expect(run('SY-P0090012')[0]).toEqual({ sku: 'SY-P0000012', by: 'similar' }) // 0 typed as 9
    expect(run('SY-P000112')[0]).toEqual({ sku: 'SY-P0000112', by: 'similar' }) // one of the zeros left out
  })

  it('treats keys that touch as neighbours: the top row, the numeric keypad (0 under 1 and 2), QWERTY letters', () => {
    // layouts as printed on a standard PC keyboard and its numeric keypad (common practice)
    expect(['4', '6', '2', '8'].every((k) => isNeighbourKey('5', k))).toBe(true)
    expect(isNeighbourKey('0', '1') && isNeighbourKey('0', '9') && isNeighbourKey('0', '2')).toBe(true)
    expect(isNeighbourKey('2', '9') || isNeighbourKey('1', '8')).toBe(false)
    expect(isNeighbourKey('s', 'a') && isNeighbourKey('s', 'w') && isNeighbourKey('s', 'x') && isNeighbourKey('s', 'e')).toBe(true)
    expect(isNeighbourKey('s', 'p')).toBe(false)
    expect(SLIP.swap).toBeLessThan(SLIP.neighbour)
  })

  it('costs a wrong key by its distance from the right one, on the layout where the two are nearest', () => {
    // numeric keypad (7 8 9 / 4 5 6 / 1 2 3 / wide 0) and top row, key centres one key width apart (common practice):
    // 5 -> 9 is one key across and one up on the keypad, sqrt(1^2 + 1^2) = 1.414; 0 -> 3 the same from the 0 key's
    // right half; 1 -> 8 is two up and one across, sqrt(2^2 + 1^2) = 2.236; 7 -> 0 three rows apart on the keypad
    // and three keys apart on the top row (7 8 9 0), so 3
    expect(keyDistance('5', '9')).toBeCloseTo(Math.SQRT2, 9)
    expect(keyDistance('0', '3')).toBeCloseTo(Math.SQRT2, 9)
    expect(keyDistance('1', '8')).toBeCloseTo(2.2360679775, 9)
    expect(keyDistance('7', '0')).toBe(3)
    expect(keyDistance('a', '1')).toBe(Infinity)
    // costs: touching 1, then 1 + d/2 up to 3 (keypad diagonal 1.707, two keys 2, 1 -> 8 2.118, 7 -> 0 2.5)
    expect(substitutionCost('5', '6')).toBe(SLIP.neighbour)
    expect(substitutionCost('5', '9')).toBeCloseTo(1 + Math.SQRT2 / 2, 9)
    expect(substitutionCost('1', '3')).toBe(2)
    expect(substitutionCost('7', '0')).toBe(2.5)
    expect(substitutionCost('q', 'p')).toBe(SLIP.other)
  })

  it('ranks a keypad diagonal above a key further off, both after the touching keys', () => {
    // typed 0001255: 0001259 has a keypad diagonal of 5 (1.41, cost 1.71), 0001250 a key two rows below it on the
    // keypad (5 -> 0, 2 key widths, cost 2; five apart on the top row), 0001256 one that touches
    const diagonal = rankOf('SY-P0001255', 'SY-P0001259')
    expect(rankOf('SY-P0001255', 'SY-P0001256')).toBeLessThan(diagonal)
    expect(diagonal).toBeLessThan(rankOf('SY-P0001255', 'SY-P0001250'))
  })
})

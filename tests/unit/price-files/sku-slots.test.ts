import { describe, expect, it } from 'vitest'
import { SkuSlots } from '../../../server/services/price-files/sku-slots'

// The reference is JavaScript's own Map (ECMAScript's keyed collection): what the compared catalogue used before,
// upper-cased SKU -> slot, with a later slot of the same key answering (Map.set replaces), and an array of the SKUs
// as written.
function reference(skus: string[]) {
  const map = new Map<string, number>()
  skus.forEach((s, i) => map.set(s.toUpperCase(), i))
  return map
}

describe('the compared catalogue\'s SKU table', () => {
  it('answers every SKU, every miss and every SKU as written as a Map does, across its growth', () => {
    const skus: string[] = []
    for (let i = 0; i < 40_000; i++) skus.push(`SY-${['P', 'D', 'C', 'H'][i % 4]}${String(i * 7919 % 1_000_003).padStart(7, '0')}`)
    skus.push('kf-pd-1001', 'Ab-12', 'ÉTRIER-7', 'straße-9', 'BRÜCKE-1', 'ЗАП-22', 'X', '')
    skus.push('KF-PD-1001', 'SY-P0007919') // a key seen before: the later slot answers
    const table = new SkuSlots()
    skus.forEach((s) => table.add(s))
    table.trim()
    const map = reference(skus)
    expect(table.size).toBe(skus.length)
    for (const [key, slot] of map) expect(table.get(key)).toBe(slot)
    skus.forEach((s, i) => expect(table.sku(i)).toBe(s))
    for (const miss of ['SY-P9999999', 'kf-pd-1001', 'SY-P000791', 'SY-P00079190', 'STRASSE-8', 'зап-22', 'É']) {
      expect(table.get(miss)).toBe(map.get(miss))
    }
    // worked by hand: 'straße-9' upper-cases to 'STRASSE-9' (ß -> SS, Unicode SpecialCasing), a key of one-byte
    // characters; 'ЗАП-22' stays a key above U+00FF
    expect(table.get('STRASSE-9')).toBe(skus.indexOf('straße-9'))
    expect(table.get('ЗАП-22')).toBe(skus.indexOf('ЗАП-22'))
    expect(table.get('KF-PD-1001')).toBe(skus.length - 2)
  })
})

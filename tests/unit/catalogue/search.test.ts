import { describe, expect, it } from 'vitest'
import type { PartType } from '#shared/schemas/catalogue/part-types'
import { FITTING_RULES } from '#shared/utils/catalogue/fitting-rules'
import { editDistance, fuzzyFor, indexTerms, planQuery } from '../../../server/services/catalogue/search-plan'
import { COMMON_DF, PartSearchIndex, type IndexInput } from '../../../server/services/catalogue/search-index'

describe('search query planning', () => {
  it('turns type and axle words into filters and numbers into dimensions', () => {
    const p = planQuery('front disc 300')
    expect(p.types).toEqual(['disc'])
    expect(p.axle).toBe('front')
    expect(p.numbers).toEqual([{ value: 300, tolerance: 0.5, dims: null, raw: '300' }])
    expect(p.terms).toEqual([])
  })

  it('reads two-word type names, decimal bores and sizes written 300x25', () => {
    const p = planQuery('Master Cylinder 22.22mm')
    expect(p.types).toEqual(['master_cylinder'])
    expect(p.numbers[0]).toMatchObject({ value: 22.22, tolerance: 0.02 })
    expect(planQuery('rear disc 260x10').numbers.map((n) => n.value)).toEqual([260, 10])
    expect(planQuery('disc 300 × 25 x 12').numbers.map((n) => n.value)).toEqual([300, 25, 12])
    // an x inside an OE number is one of its letters, not a size separator (common practice: OE numbers mix
    // letters and digits), or "ZQ 66MU9X 01" would be searched as "ZQ66MU901"
    expect(planQuery('ZQ 66MU9X 01').terms.map((t) => t.term)).toEqual(['zq66mu9x01'])
    expect(planQuery('brake fluid').types).toEqual(['fluid'])
  })

  it('converts inch fractions with 1 in = 25.4 mm (NIST SP 811, App. B.8)', () => {
    const p = planQuery('7/8 master')
    expect(p.numbers[0]!.value).toBeCloseTo(22.225, 9)
    expect(planQuery('1in mc').numbers[0]!.value).toBeCloseTo(25.4, 9)
  })

  it('aims numbers at a dimension when the query names it', () => {
    expect(planQuery('piston 54').numbers[0]!.dims).toEqual(['piston'])
    expect(planQuery('bore 22.22').numbers[0]!.dims).toEqual(['bore'])
  })

  it('keeps an OE number typed with spaces as one identifier', () => {
    expect(planQuery('VLT 615 301 C').identifiers).toEqual(['vlt615301c'])
    expect(planQuery('QLN 1234-567').identifiers).toEqual(['qln1234567'])
    expect(planQuery('KP-1004').terms).toEqual([{ term: 'kp1004', kind: 'identifier', prefix: true, fuzzy: 1 }])
    expect(planQuery('280 300').identifiers).toEqual([]) // two sizes, not a number
  })

  it('drops stop words, tolerates a slip in a type word and gives fuzziness only to longer words', () => {
    const p = planQuery('the brake pads for pennon')
    expect(p.types).toEqual(['pad_set'])
    expect(p.ignored).toEqual(['the', 'brake', 'for'])
    expect(p.terms).toEqual([{ term: 'pennon', kind: 'word', prefix: true, fuzzy: 1 }])
    expect(planQuery('calipre').types).toEqual(['caliper'])
    expect(planQuery('cylindre').types).toEqual(['master_cylinder', 'wheel_cylinder'])
    expect(planQuery('ff').terms[0]).toMatchObject({ fuzzy: 0, prefix: true })
    expect(planQuery('reman electric caliper').attributes).toEqual(['remanufactured', 'electric'])
  })

  it('measures slips as optimal string alignment distance (adjacent swap = 1; Damerau 1964, as summarised for Damerau-Levenshtein distance)', () => {
    expect(editDistance('caliper', 'calipre')).toBe(1)
    expect(editDistance('kitten', 'sitting')).toBe(3) // the classic Levenshtein example, distance 3
    expect(editDistance('abc', 'abc')).toBe(0)
    // OSA, unlike unrestricted Damerau-Levenshtein (2), gives 3 for CA -> ABC: the worked example in the Wikipedia
    // article "Damerau-Levenshtein distance" (from memory)
    expect(editDistance('ca', 'abc')).toBe(3)
    expect(editDistance('ca', 'abcdef', 1)).toBeGreaterThan(1) // stops early above the limit
    expect([fuzzyFor('pads', 'word'), fuzzyFor('pennon', 'word'), fuzzyFor('greywell', 'word'), fuzzyFor('kp1004', 'identifier')]).toEqual([0, 1, 2, 1])
  })

  it('indexes the same words a query is scored on', () => {
    expect(indexTerms('Front brake disc 300 × 25 mm vented, Greywell Coated, for Veltra Pennon')).toEqual(['greywell', 'coated', 'veltra', 'pennon'])
  })
})

const disc = (id: number, d: number, extra: Partial<IndexInput> = {}): IndexInput => ({
  id, sku: `KD-${id}`, type: 'disc', productLine: 'Greywell Standard', status: 'active', oeNumbers: [], replaces: [],
  description: `Front brake disc ${d} × 25 mm vented, for Veltra Pennon`,
  specs: { axle: 'front', diameterMm: d, thicknessMm: 25, minThicknessMm: 23, heightMm: 40, centreBoreMm: 57.1, boltHoles: 5, pcdMm: 112, vented: true },
  ...extra,
})
const mc = (id: number, bore: number, extra: Partial<IndexInput> = {}): IndexInput => ({
  id, sku: `KM-${id}`, type: 'master_cylinder', productLine: 'Carrick New', status: 'active', oeNumbers: [], replaces: [],
  description: `Master cylinder tandem ${bore} mm bore, for Quillan Dray`,
  specs: { boreMm: bore, tandem: true, ports: 2, reservoir: 'integrated', condition: 'new', coreDepositApplies: false }, ...extra,
})
function index(parts: IndexInput[]) {
  const ix = new PartSearchIndex(FITTING_RULES)
  ix.addAll(parts)
  const run = (q: string, f = {}) => ix.search(planQuery(q), f).hits.map((h) => ({ sku: ix.info(h.id)!.sku, by: h.by, oldSku: h.oldSku }))
  return { ix, run }
}

describe('search index', () => {
  const parts = [
    disc(1, 280, { oeNumbers: ['VLT 615 301 C'] }), disc(2, 300, { oeNumbers: ['VLT 615 302 C'] }),
    disc(3, 300, { productLine: 'Ashfall Ceramic', description: 'Front brake disc 300 mm ceramic coated, for Kaskel Orrin' }),
    disc(10, 300, { sku: 'KD-10' }), disc(100, 300, { sku: 'KD-100', replaces: [{ oldSku: 'KD-8001', note: 'KD-8001 was replaced by KD-100.' }] }),
    disc(8001, 300, { sku: 'KD-8001', status: 'discontinued' }),
    mc(20, 22.22, { oeNumbers: ['QLN 1234-567'] }), mc(21, 25.4), mc(22, 23.81),
  ]

  it('ranks an exact SKU first, then longer SKUs that start with it', () => {
    const { run } = index(parts)
    expect(run('KD-10').slice(0, 2)).toEqual([{ sku: 'KD-10', by: 'sku' }, { sku: 'KD-100', by: 'prefix' }])
  })

  it('finds an OE number however it is typed, and with one slip', () => {
    const { run } = index(parts)
    expect(run('vlt615301c')[0]).toMatchObject({ sku: 'KD-1', by: 'oe' })
    expect(run('VLT-615-301-C')[0]).toMatchObject({ sku: 'KD-1', by: 'oe' })
    expect(run('VLT 615 310 C')[0]).toMatchObject({ sku: 'KD-1', by: 'similar' }) // two digits swapped
    expect(run('QLN 1234-576')[0]).toMatchObject({ sku: 'KM-20', by: 'similar' })
  })

  it('lists the replacement of a superseded SKU first and says which SKU it replaces', () => {
    const { run } = index(parts)
    expect(run('KD-8001').slice(0, 2)).toEqual([{ sku: 'KD-100', by: 'superseded', oldSku: 'KD-8001' }, { sku: 'KD-8001', by: 'sku' }])
  })

  it('filters by type, axle, attributes and dimension ranges', () => {
    const { run } = index(parts)
    expect(run('master cylinder 22.22').map((r) => r.sku)).toEqual(['KM-20'])
    expect(run('', { ranges: { bore: { min: 23, max: 26 } } }).map((r) => r.sku).sort()).toEqual(['KM-21', 'KM-22'])
    expect(run('front disc 280').map((r) => r.sku)).toEqual(['KD-1'])
    expect(run('rear disc 300')).toEqual([])
    expect(run('disc', { axle: 'rear' })).toEqual([])
    expect(run('solid disc')).toEqual([])
    expect(run('7/8 master').map((r) => r.sku)).toEqual(['KM-20'])
  })

  it('scores words with typo tolerance and falls back to any word when all words find nothing together', () => {
    const { run } = index(parts)
    expect(run('ceramic')[0]!.sku).toBe('KD-3')
    expect(run('ceramik kaskel')[0]!.sku).toBe('KD-3')
    expect(run('orrin dray').map((r) => r.sku).sort()).toEqual(['KD-3', 'KM-20', 'KM-21', 'KM-22'])
  })

  it(`checks a word on more than ${COMMON_DF} parts of a type as a filter rather than scoring it`, () => {
    const many = Array.from({ length: COMMON_DF + 50 }, (_, i) => disc(1000 + i, 280 + (i % 3) * 10, { description: `Front brake disc, Quarrystone line ${i % 2 ? 'slotted' : 'plain'}` }))
    const { run } = index([...many, disc(5000, 300, { description: 'Front brake disc, Ironmere slotted' })])
    const slotted = run('quarrystone slotted')
    expect(slotted.length).toBe(Math.floor((COMMON_DF + 50) / 2))
    expect(slotted.every((r) => Number(r.sku.slice(3)) % 2 === 1)).toBe(true)
    expect(run('quarystone 300').length).toBe(many.filter((_, i) => i % 3 === 2).length) // slip in a common word
    expect(run('ironmere').map((r) => r.sku)).toEqual(['KD-5000'])
  })

  it('follows edits: an upserted part is found by its new words, a removed one is gone', () => {
    const { ix, run } = index(parts)
    ix.upsert(mc(21, 25.4, { description: 'Uprated master cylinder 1 in bore, for Quillan Hopper', oeNumbers: ['QLN 9999-000'] }))
    expect(run('hopper').map((r) => r.sku)).toEqual(['KM-21'])
    expect(run('QLN 9999-000')[0]).toMatchObject({ sku: 'KM-21', by: 'oe' })
    ix.remove(20)
    expect(run('QLN 1234-567').map((r) => r.sku)).not.toContain('KM-20')
    expect(ix.size).toBe(parts.length - 1)
  })

  it('finds candidates for compatible alternatives by the exact part of the fitting rule', () => {
    const { ix } = index(parts)
    expect(ix.sameFittingKey(2).sort((a, b) => a - b)).toEqual([3, 10, 100]) // discontinued KD-8001 left out
  })

  it.each<[PartType, string]>([['pad_set', 'pads'], ['caliper', 'calipers']])('searches only the types asked for (%s)', (type, word) => {
    const { ix } = index(parts)
    expect(ix.search(planQuery(word)).types).toEqual([type])
  })
})

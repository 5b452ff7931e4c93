import { describe, expect, it } from 'vitest'
import { PART_TYPES } from '#shared/schemas/catalogue/part-types'
import {
  CaliperSpecsSchema, DiscSpecsSchema, FrictionCodeSchema, MasterCylinderSpecsSchema, parseSpecs, SPEC_SCHEMAS,
} from '#shared/schemas/catalogue/specs'
import { SPEC_FIELDS } from '#shared/schemas/catalogue/spec-fields'
import { PartCreateSchema } from '#shared/schemas/catalogue/upkeep'
import { parsePartListQuery } from '#shared/schemas/catalogue/list-query'
import { answersFromQuery, VehicleFacetsQuerySchema } from '#shared/schemas/catalogue/vehicle-queries'
import { sameFitting } from '#shared/utils/catalogue/fitting-rules'

const disc = { axle: 'front', diameterMm: 300, thicknessMm: 25, minThicknessMm: 23, heightMm: 40.5, centreBoreMm: 57.1, boltHoles: 5, pcdMm: 112, vented: true }
const caliper = { position: 'front-left', caliperType: 'floating', pistonCount: 1, pistonDiametersMm: [57], padShape: 'PS-V151-62-195', parkingBrake: 'none', condition: 'new', coreDepositApplies: false }
const paths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) => (r.error?.issues ?? []).map((i) => i.path.join('.'))

describe('part specification schemas', () => {
  it('has a schema and a display table for every part type, with the unit in every dimension name', () => {
    for (const t of PART_TYPES) {
      expect(SPEC_SCHEMAS[t]).toBeDefined()
      for (const f of SPEC_FIELDS[t]) if (f.unit) expect(f.key).toMatch(f.unit === 'mm' ? /Mm$/ : /Ml$/)
    }
  })

  it('accepts a vented disc and refuses a minimum thickness at or above the nominal one', () => {
    expect(DiscSpecsSchema.safeParse(disc).success).toBe(true)
    const r = DiscSpecsSchema.safeParse({ ...disc, minThicknessMm: 25 })
    expect(paths(r)).toEqual(['minThicknessMm'])
  })

  it('refuses unknown spec fields (no silent extras) and names missing ones', () => {
    expect(paths(DiscSpecsSchema.safeParse({ ...disc, colour: 'red' }))).toEqual([''])
    expect(paths(DiscSpecsSchema.safeParse({ ...disc, diameterMm: undefined }))).toContain('diameterMm')
  })

  it('catches a disc diameter typed in centimetres and a bore typed in inches (plausibility ranges, common practice)', () => {
    expect(DiscSpecsSchema.safeParse({ ...disc, diameterMm: 30 }).success).toBe(false)
    expect(MasterCylinderSpecsSchema.safeParse({ boreMm: 0.875, tandem: true, ports: 2, reservoir: 'integrated', condition: 'new', coreDepositApplies: false }).success).toBe(false)
    // 7/8 in = 22.225 mm with 1 in = 25.4 mm exactly (NIST SP 811, App. B.8)
    expect(MasterCylinderSpecsSchema.safeParse({ boreMm: (7 / 8) * 25.4, tandem: true, ports: 2, reservoir: 'integrated', condition: 'new', coreDepositApplies: false }).success).toBe(true)
  })

  it('reads SAE J866 edge codes: two letters from C, D, E, F, G, H or Z (SAE J866 Table 1)', () => {
    for (const ok of ['FF', 'GG', 'EF', 'ZZ', 'ff']) expect(FrictionCodeSchema.safeParse(ok).success).toBe(true)
    expect(FrictionCodeSchema.parse('fg')).toBe('FG')
    for (const bad of ['F', 'FFF', 'AB', 'FX', 'I1']) expect(FrictionCodeSchema.safeParse(bad).success).toBe(false)
  })

  it('counts caliper piston diameters per side for fixed calipers and per piston for floating ones (check-values.md)', () => {
    expect(CaliperSpecsSchema.safeParse(caliper).success).toBe(true)
    expect(CaliperSpecsSchema.safeParse({ ...caliper, caliperType: 'fixed', pistonCount: 4, pistonDiametersMm: [38, 42] }).success).toBe(true)
    expect(paths(CaliperSpecsSchema.safeParse({ ...caliper, caliperType: 'fixed', pistonCount: 4, pistonDiametersMm: [38, 42, 38, 42] }))).toEqual(['pistonDiametersMm'])
    expect(paths(CaliperSpecsSchema.safeParse({ ...caliper, caliperType: 'fixed', pistonCount: 3, pistonDiametersMm: [38] }))).toContain('pistonCount')
  })

  it('insists that a remanufactured unit carries a core deposit (common practice)', () => {
    expect(paths(CaliperSpecsSchema.safeParse({ ...caliper, condition: 'remanufactured', coreDepositApplies: false }))).toEqual(['coreDepositApplies'])
    expect(CaliperSpecsSchema.safeParse({ ...caliper, condition: 'remanufactured', coreDepositApplies: true }).success).toBe(true)
  })

  it('parses specs for a type and throws a field-named error otherwise', () => {
    expect(parseSpecs('fluid', { grade: 'DOT 4', volumeMl: 1000 })).toEqual({ grade: 'DOT 4', volumeMl: 1000 })
    expect(() => parseSpecs('fluid', { grade: 'DOT 6', volumeMl: 1000 })).toThrow(/grade/)
  })

  it('validates a new part as a whole', () => {
    expect(PartCreateSchema.safeParse({ sku: 'kd-9000', type: 'disc', description: 'x', specs: disc }).data?.sku).toBe('KD-9000')
    expect(paths(PartCreateSchema.safeParse({ sku: 'bad sku', type: 'rotor', description: '', specs: [] }))).toEqual(expect.arrayContaining(['sku', 'type', 'description', 'specs']))
  })
})

describe('compatible alternatives', () => {
  it('matches the same fitting dimensions within the stated tolerances', () => {
    const pad = { axle: 'front', padShape: 'A', widthMm: 151, heightMm: 62, thicknessMm: 19.5, wearSensor: 'none', frictionCode: 'FF' }
    expect(sameFitting('pad_set', pad, { ...pad, widthMm: 151.4, frictionCode: 'GG' })).toBe(true)
    // another backing-plate shape does not fit the same caliper, whatever the size (common practice)
    expect(sameFitting('pad_set', pad, { ...pad, padShape: 'B' })).toBe(false)
    expect(sameFitting('pad_set', pad, { ...pad, widthMm: 151.6 })).toBe(false)
    expect(sameFitting('disc', disc, { ...disc, diameterMm: 300.1 })).toBe(false)
    expect(sameFitting('caliper', caliper, { ...caliper, pistonDiametersMm: [54] })).toBe(false)
    expect(sameFitting('caliper', caliper, { ...caliper, condition: 'remanufactured', coreDepositApplies: true })).toBe(true)
  })

  it('never offers a part with no fitting figure recorded as an alternative', () => {
    // a 300 mm front disc and a 264 mm rear disc, both brought by a price file with no specifications yet
    expect(sameFitting('disc', {}, {})).toBe(false)
    expect(sameFitting('disc', { axle: 'front' }, { axle: 'front' })).toBe(false) // an axle is not a size
    expect(sameFitting('disc', disc, {})).toBe(false)
    expect(sameFitting('fluid', { grade: 'DOT 4' }, { grade: 'DOT 4' })).toBe(true) // fluid is matched by grade alone
    expect(sameFitting('fluid', {}, {})).toBe(false)
  })
})

describe('query schemas', () => {
  it('turns exact dimensions into a narrow range and checks ranges', () => {
    const q = parsePartListQuery({ boreMm: '22.22', diameterMin: '280', diameterMax: '300', page: '2' })
    expect(q.ranges.bore!.min).toBeCloseTo(22.21, 6)
    expect(q.ranges.bore!.max).toBeCloseTo(22.23, 6)
    expect(q.ranges.diameter).toEqual({ min: 280, max: 300 })
    expect(q.page).toBe(2)
    expect(q.pageSize).toBe(20)
  })

  it('explains a bad filter in the words of the search form, never the parameter\'s name', () => {
    const messages = (raw: Record<string, unknown>) => { try { parsePartListQuery(raw); return [] } catch (e) { return (e as { issues: { message: string }[] }).issues.map((i) => i.message) } }
    expect(messages({ diameterMin: 'abc' })).toEqual(['Diameter from (mm) must be a number'])
    expect(messages({ boreMm: '-1' })).toEqual(['Bore (mm) must be at least 0'])
    expect(messages({ diameterMin: '300', diameterMax: '280' })).toEqual(['Diameter to must not be less than diameter from'])
    expect(messages({ q: 'x'.repeat(201) })).toEqual(['Search is at most 200 characters'])
  })

  it('names the malformed field', () => {
    const issues = (raw: Record<string, unknown>) => { try { parsePartListQuery(raw); return [] } catch (e) { return (e as { issues: { path: PropertyKey[] }[] }).issues.map((i) => i.path.join('.')) } }
    expect(issues({ diameterMin: 'abc' })).toEqual(['diameterMin'])
    expect(issues({ diameterMin: '300', diameterMax: '280' })).toEqual(['diameterMax'])
    expect(issues({ pageSize: '101' })).toEqual(['pageSize'])
    expect(issues({ page: '0' })).toEqual(['page'])
    expect(issues({ type: 'rotor' })).toEqual(['type'])
    expect(issues({ axle: 'middle' })).toEqual(['axle'])
    expect(issues({ q: 'x'.repeat(201) })).toEqual(['q'])
  })

  it('wants a make before a model and a model before a year', () => {
    expect(VehicleFacetsQuerySchema.safeParse({ model: 'Pennon' }).error?.issues[0]?.path).toEqual(['make'])
    expect(VehicleFacetsQuerySchema.safeParse({ make: 'Veltra', year: '2020' }).error?.issues[0]?.path).toEqual(['model'])
    expect(VehicleFacetsQuerySchema.safeParse({ make: 'Veltra', model: 'Pennon', year: 'soon' }).success).toBe(false)
  })

  it('reads option answers from opt.<key> query parameters', () => {
    expect(answersFromQuery({ 'opt.front_disc_diameter_mm': '300', 'opt.parking_brake': ['cable', 'electric'], 'opt.empty': '', other: '1' }))
      .toEqual({ front_disc_diameter_mm: '300', parking_brake: 'electric' })
  })
})

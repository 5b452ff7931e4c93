import { describe, expect, it } from 'vitest'
import type { PartType } from '#shared/schemas/catalogue/part-types'
import { parseSpecs } from '#shared/schemas/catalogue/specs'
import { matchQualifiers } from '#shared/utils/catalogue/qualifiers'
import { BORE_MISMATCH, buildCatalogue, MAKES } from '../../../server/seed/catalogue-data'

const cat = buildCatalogue()
const bySku = new Map(cat.parts.map((p) => [p.sku, p]))
const byKey = new Map(cat.vehicles.map((v) => [v.key, v]))
/** Two qualifier sets can hold at once (no key answered differently). */
const compatible = (a: Record<string, string>, b: Record<string, string>) => matchQualifiers(a, b) !== 'excluded'
// 1 in = 25.4 mm exactly (NIST SP 811, App. B.8); the usual master cylinder bores are 3/4 .. 1 in in 1/16 steps (common practice)
const inchBores = [12, 13, 14, 15, 16].map((sixteenths) => (sixteenths / 16) * 25.4)

describe('the demo catalogue', () => {
  it('is big enough and invented: at least 6 makes, 60 vehicles, 600 parts, unique SKUs', () => {
    expect(new Set(cat.vehicles.map((v) => v.make)).size).toBeGreaterThanOrEqual(6)
    expect(cat.vehicles.length).toBeGreaterThanOrEqual(60)
    expect(cat.parts.length).toBeGreaterThanOrEqual(600)
    expect(bySku.size).toBe(cat.parts.length)
    expect(MAKES.map((m) => m.make)).toEqual(['Veltra', 'Kaskel', 'Durmond', 'Lystrom', 'Brenmoor', 'Taviro', 'Quillan'])
  })

  it('is the same on every run (seeded PRNG)', () => {
    expect(JSON.stringify(buildCatalogue())).toBe(JSON.stringify(cat))
  })

  it('has specs that pass their type schema', () => {
    for (const p of cat.parts) expect(() => parseSpecs(p.type, p.specs), p.sku).not.toThrow()
  })

  it('has realistic figures: discs 240-380 mm, vented discs 2 mm of wear, solid 1-1.5 mm, inch-size master cylinder bores', () => {
    for (const p of cat.parts.filter((x) => x.type === 'disc')) {
      const s = p.specs as { diameterMm: number; thicknessMm: number; minThicknessMm: number; vented: boolean }
      expect(s.diameterMm).toBeGreaterThanOrEqual(240)
      expect(s.diameterMm).toBeLessThanOrEqual(380)
      const wear = s.thicknessMm - s.minThicknessMm
      if (s.vented) expect(wear).toBe(2)
      else expect([1, 1.5]).toContain(wear)
    }
    for (const v of cat.vehicles) expect(inchBores.some((b) => Math.abs(b - v.mcBoreMm) < 0.01), v.key).toBe(true)
    for (const p of cat.parts.filter((x) => x.type === 'caliper')) {
      const s = p.specs as { caliperType: string; pistonDiametersMm: number[] }
      for (const d of s.pistonDiametersMm) expect(d).toBeGreaterThanOrEqual(s.caliperType === 'fixed' ? 36 : 34)
      for (const d of s.pistonDiametersMm) expect(d).toBeLessThanOrEqual(60)
    }
  })

  it('gives every vehicle what the hydraulic chain needs', () => {
    for (const v of cat.vehicles) {
      expect(v.mcBoreMm && v.pedalRatio && v.kerbMassKg && v.tyreSize && v.circuitSplit, v.key).toBeTruthy()
      for (const axle of ['front', 'rear'] as const) {
        const brakes = v.brakes.filter((b) => b.axle === axle)
        expect(brakes.length, `${v.key} ${axle}`).toBeGreaterThan(0)
        for (const b of brakes) {
          if (b.kind === 'disc') expect(b.discDiameterMm && b.discThicknessMm && b.discMinThicknessMm && b.caliperType && b.pistonDiametersMm?.length).toBeTruthy()
          else expect(b.drumDiameterMm && b.drumMaxDiameterMm && b.wheelCylinderBoreMm).toBeTruthy()
        }
      }
    }
  })

  it('asks a question wherever a vehicle has two configurations, and every question matters to some fitment', () => {
    for (const v of cat.vehicles) {
      const fronts = v.brakes.filter((b) => b.axle === 'front').length
      expect(v.options.some((o) => o.key === 'front_disc_diameter_mm')).toBe(fronts > 1)
      for (const o of v.options) {
        expect(cat.fitments.some((f) => f.vehicleKey === v.key && f.qualifiers[o.key] !== undefined), `${v.key} ${o.key}`).toBe(true)
      }
    }
    const keys = new Set(cat.vehicles.flatMap((v) => v.options.map((o) => o.key)))
    expect([...keys].sort()).toEqual(['front_disc_diameter_mm', 'parking_brake', 'rear_brake'])
  })

  it('keeps bores and sizes consistent across fitment (only the declared uprated parts differ, with a note)', () => {
    let declared = 0
    for (const f of cat.fitments) {
      const v = byKey.get(f.vehicleKey)!
      const p = bySku.get(f.sku)!
      const s = p.specs as Record<string, number & number[]>
      const brakes = v.brakes.filter((b) => b.axle === f.axle && compatible(b.qualifiers, f.qualifiers))
      const agrees = (pick: (b: (typeof brakes)[number]) => unknown, value: unknown) => brakes.some((b) => JSON.stringify(pick(b)) === JSON.stringify(value))
      let ok = true
      if (p.type === 'disc') ok = agrees((b) => b.discDiameterMm, s.diameterMm) && agrees((b) => b.discThicknessMm, s.thicknessMm) && agrees((b) => b.discMinThicknessMm, s.minThicknessMm)
      if (p.type === 'caliper') ok = agrees((b) => b.pistonDiametersMm, s.pistonDiametersMm)
      if (p.type === 'drum') ok = agrees((b) => b.drumDiameterMm, s.diameterMm)
      if (p.type === 'wheel_cylinder') ok = agrees((b) => b.wheelCylinderBoreMm, s.boreMm)
      if (p.type === 'master_cylinder') ok = Math.abs(v.mcBoreMm - (s.boreMm as number)) < 0.001
      if (!ok) {
        declared++
        expect(p.productLine, `${f.sku} on ${f.vehicleKey}`).toMatch(/Uprated/)
        expect(f.note).toMatch(/instead of the original/)
      }
    }
    expect(declared).toBeGreaterThan(0)
  })

  it('fits pads to the calipers on the same vehicle and axle (same pad shape)', () => {
    for (const f of cat.fitments.filter((x) => bySku.get(x.sku)!.type === 'pad_set')) {
      const shape = bySku.get(f.sku)!.specs.padShape
      const calipers = cat.fitments.filter((c) => c.vehicleKey === f.vehicleKey && c.axle === f.axle && bySku.get(c.sku)!.type === 'caliper' && compatible(c.qualifiers, f.qualifiers))
      expect(calipers.length).toBeGreaterThan(0)
      for (const c of calipers) expect(bySku.get(c.sku)!.specs.padShape, `${f.sku} / ${c.sku}`).toBe(shape)
    }
  })

  it('declares the bore-change pairs the calculations need', () => {
    const mc = cat.fitments.find((f) => byKey.get(f.vehicleKey)!.model === BORE_MISMATCH.masterCylinder.model && bySku.get(f.sku)!.productLine === BORE_MISMATCH.masterCylinder.productLine && bySku.get(f.sku)!.type === 'master_cylinder')!
    expect(byKey.get(mc.vehicleKey)!.mcBoreMm).toBe(22.22)
    expect(bySku.get(mc.sku)!.specs.boreMm).toBe(25.4)
    const cal = cat.fitments.find((f) => byKey.get(f.vehicleKey)!.model === BORE_MISMATCH.caliper.model && bySku.get(f.sku)!.productLine === BORE_MISMATCH.caliper.productLine)!
    expect(bySku.get(cal.sku)!.specs.pistonDiametersMm).toEqual([57])
    expect(byKey.get(cal.vehicleKey)!.brakes.find((b) => b.axle === 'front' && b.qualifiers.front_disc_diameter_mm === '280')!.pistonDiametersMm).toEqual([54])
  })

  it('prices remanufactured units with a core deposit and new ones without; stock is zero somewhere in each branch', () => {
    for (const p of cat.parts.filter((x) => ['caliper', 'master_cylinder'].includes(x.type))) {
      expect(p.coreDepositMinor > 0, p.sku).toBe(p.specs.condition === 'remanufactured')
    }
    for (const p of cat.parts) expect(Number.isInteger(p.listPriceMinor) && p.listPriceMinor > 0 && p.tradeCostMinor < p.listPriceMinor).toBe(true)
    expect(cat.parts.some((p) => p.stock.NGT === 0)).toBe(true)
    expect(cat.parts.some((p) => p.stock.RVS === 0)).toBe(true)
    expect(cat.parts.filter((p) => p.type === 'caliper' && p.specs.condition === 'remanufactured').length).toBeGreaterThan(10)
  })

  it('supersedes old SKUs with existing parts, has OE numbers, and fits fluid of the vehicle grade', () => {
    expect(cat.supersessions.length).toBeGreaterThanOrEqual(10)
    for (const s of cat.supersessions) expect(bySku.get(s.newSku)?.status).toBe('active')
    expect(cat.parts.filter((p) => p.oe.length).length).toBeGreaterThan(cat.parts.length * 0.8)
    for (const f of cat.fitments.filter((x) => bySku.get(x.sku)!.type === 'fluid')) {
      expect((bySku.get(f.sku)!.specs as { grade: string }).grade).toBe(byKey.get(f.vehicleKey)!.fluidGrade)
    }
    const types = new Set(cat.parts.map((p) => p.type))
    expect([...types].sort()).toEqual(['caliper', 'disc', 'drum', 'fitting_kit', 'fluid', 'hose', 'master_cylinder', 'pad_set', 'shoe_set', 'wear_sensor', 'wheel_cylinder'] satisfies PartType[])
  })
})

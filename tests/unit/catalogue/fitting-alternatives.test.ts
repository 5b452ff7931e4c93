import { describe, expect, it } from 'vitest'
import { fittingDifferences, fittingRuleWords, sameFitting } from '#shared/utils/catalogue/fitting-rules'

// common practice: pads swap only with the same backing-plate shape and the same kind of wear sensor; a master
// cylinder only with the same bore, ports, reservoir and flange; a caliper only with the same pistons, carrier
// (pad shape), mounting centres and hose thread.
const pad = { axle: 'front', padShape: 'QP-118', wearSensor: 'none', widthMm: 131.2, heightMm: 56.3, thicknessMm: 17.5, frictionCode: 'FF' }

describe('compatible alternatives compare more than one figure', () => {
  it('pads: size within 0.5 mm, and the same shape and sensor', () => {
    expect(sameFitting('pad_set', pad, { ...pad, heightMm: 56.7, frictionCode: 'GG' })).toBe(true)
    expect(sameFitting('pad_set', pad, { ...pad, padShape: 'QP-120' })).toBe(false)
    expect(sameFitting('pad_set', pad, { ...pad, wearSensor: 'integrated' })).toBe(false)
  })

  it('master cylinders: bore, ports, reservoir and, when recorded, the flange centres', () => {
    const mc = { boreMm: 22.22, tandem: true, ports: 4, reservoir: 'integrated' }
    expect(sameFitting('master_cylinder', mc, { ...mc })).toBe(true)
    expect(sameFitting('master_cylinder', mc, { ...mc, reservoir: 'remote' })).toBe(false)
    expect(sameFitting('master_cylinder', { ...mc, mountingCentresMm: 86 }, { ...mc, mountingCentresMm: 90 })).toBe(false)
    // recorded on one only: cannot be confirmed, so not offered
    expect(sameFitting('master_cylinder', { ...mc, mountingCentresMm: 86 }, mc)).toBe(false)
  })

  it('calipers: mounting centres and hose thread as well as pistons', () => {
    const c = { position: 'front left', caliperType: 'floating', pistonCount: 1, pistonDiametersMm: [54], padShape: 'QP-118', parkingBrake: 'none', mountingCentresMm: 112, hoseThread: 'M10x1' }
    expect(sameFitting('caliper', c, { ...c })).toBe(true)
    expect(sameFitting('caliper', c, { ...c, hoseThread: '3/8-24 UNF' })).toBe(false)
    expect(sameFitting('caliper', c, { ...c, mountingCentresMm: 120 })).toBe(false)
  })

  it('says what was compared and what differs, with units', () => {
    expect(fittingRuleWords('pad_set')).toBe('same axle, same pad shape, same wear sensor, width within ±0.5 mm, height within ±0.5 mm, thickness within ±0.5 mm')
    expect(fittingDifferences('pad_set', pad, { ...pad, heightMm: 56.7, frictionCode: 'GG' })).toEqual([
      { key: 'heightMm', label: 'Height', mine: '56.3', theirs: '56.7', unit: 'mm' },
      { key: 'frictionCode', label: 'Friction code (SAE J866)', mine: 'FF', theirs: 'GG', unit: '' },
    ])
  })
})

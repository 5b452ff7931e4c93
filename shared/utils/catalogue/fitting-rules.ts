/** Compatible alternatives: the fitting dimensions two parts of one type must share, and how closely. */
import type { PartType } from '../../schemas/catalogue/part-types'
import { SPEC_FIELDS } from '../../schemas/catalogue/spec-fields'

export interface FittingRule { key: string; tolerance?: number }

/**
 * Two parts of one type are interchangeable when these agree: numbers within `tolerance` (mm), everything else
 * equal; a figure neither part records does not stop a match, one recorded on only one of them does. Tolerances
 * are our stated catalogue rule (common practice: pad plates within half a millimetre, hydraulic bores and disc
 * sizes exact). Beyond size, pads must share the backing-plate shape and the kind of wear sensor; calipers the
 * piston sizes, the carrier's pad shape, the mounting-bolt centres and the hose thread; master cylinders the
 * bore, the ports, the reservoir and the mounting-flange centres.
 */
export const FITTING_RULES: Record<PartType, FittingRule[]> = {
  disc: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'thicknessMm', tolerance: 0 }, { key: 'heightMm', tolerance: 0.5 },
    { key: 'centreBoreMm', tolerance: 0.1 }, { key: 'boltHoles' }, { key: 'pcdMm', tolerance: 0 }, { key: 'vented' }],
  pad_set: [{ key: 'axle' }, { key: 'padShape' }, { key: 'wearSensor' }, { key: 'widthMm', tolerance: 0.5 }, { key: 'heightMm', tolerance: 0.5 }, { key: 'thicknessMm', tolerance: 0.5 }],
  caliper: [{ key: 'position' }, { key: 'caliperType' }, { key: 'pistonCount' }, { key: 'pistonDiametersMm', tolerance: 0 }, { key: 'padShape' }, { key: 'parkingBrake' },
    { key: 'mountingCentresMm', tolerance: 0 }, { key: 'hoseThread' }],
  drum: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'widthMm', tolerance: 0.5 }, { key: 'boltHoles' }],
  shoe_set: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'widthMm', tolerance: 0.5 }, { key: 'parkingLever' }],
  wheel_cylinder: [{ key: 'axle' }, { key: 'boreMm', tolerance: 0.01 }, { key: 'side' }],
  hose: [{ key: 'position' }, { key: 'lengthMm', tolerance: 5 }, { key: 'threadA' }, { key: 'threadB' }],
  fitting_kit: [{ key: 'axle' }, { key: 'kitFor' }, { key: 'padShape' }],
  wear_sensor: [{ key: 'axle' }, { key: 'lengthMm', tolerance: 10 }, { key: 'connector' }],
  master_cylinder: [{ key: 'boreMm', tolerance: 0.01 }, { key: 'tandem' }, { key: 'ports' }, { key: 'reservoir' }, { key: 'mountingCentresMm', tolerance: 0 }],
  fluid: [{ key: 'grade' }],
}

/**
 * True when `b` fits where `a` fits by the rules above. A match needs at least one measured figure of the type (a
 * rule with a tolerance; for a type without one, any rule's figure) recorded on both parts: two parts with nothing
 * recorded (new parts a price file brought, before their specifications are entered) are not alternatives.
 */
export function sameFitting(type: PartType, a: Record<string, unknown>, b: Record<string, unknown>): boolean {
  const measured = FITTING_RULES[type].filter((r) => r.tolerance !== undefined)
  const deciding = measured.length ? measured : FITTING_RULES[type]
  if (!deciding.some((r) => !absent(a[r.key]) && !absent(b[r.key]))) return false
  for (const rule of FITTING_RULES[type]) {
    const x = a[rule.key], y = b[rule.key]
    if (absent(x) && absent(y)) continue
    if (rule.tolerance !== undefined) {
      const xs = Array.isArray(x) ? x : [x], ys = Array.isArray(y) ? y : [y]
      if (xs.length !== ys.length) return false
      for (let i = 0; i < xs.length; i++) {
        if (typeof xs[i] !== 'number' || typeof ys[i] !== 'number') return false
        if (Math.abs((xs[i] as number) - (ys[i] as number)) > rule.tolerance + 1e-9) return false
      }
    } else if (x !== y) return false
  }
  return true
}

const absent = (v: unknown) => v === undefined || v === null || v === ''

export interface FittingDifference { key: string; label: string; mine: string; theirs: string; unit: string }

const written = (v: unknown): string => {
  if (absent(v)) return 'not recorded'
  if (Array.isArray(v)) return v.map(written).join(' / ')
  if (typeof v === 'boolean') return v ? 'yes' : 'no'
  if (typeof v === 'number') return String(Number(v.toFixed(2)))
  return String(v)
}

/**
 * What differs between a part and an alternative, in the order the part page lists figures: the figures within a
 * rule's tolerance that are not identical, and every other figure (friction code, condition, ...) that is not the
 * same. The fitting rules themselves are met, or the alternative would not be offered.
 */
export function fittingDifferences(type: PartType, mine: Record<string, unknown>, theirs: Record<string, unknown>): FittingDifference[] {
  return (SPEC_FIELDS[type] ?? []).flatMap((f) => {
    const a = written(mine[f.key]), b = written(theirs[f.key])
    return a === b ? [] : [{ key: f.key, label: f.label, mine: a, theirs: b, unit: f.unit && !absent(mine[f.key]) && !absent(theirs[f.key]) ? f.unit : '' }]
  })
}

/** The fitting rule of a type in words: "axle the same, width within ±0.5 mm, ..." */
export function fittingRuleWords(type: PartType): string {
  const labels = new Map((SPEC_FIELDS[type] ?? []).map((f) => [f.key, f.label.toLowerCase()]))
  return FITTING_RULES[type].map((r) => {
    const label = labels.get(r.key) ?? r.key
    return r.tolerance ? `${label} within ±${r.tolerance} mm` : r.tolerance === 0 ? `${label} exactly` : `same ${label}`
  }).join(', ')
}

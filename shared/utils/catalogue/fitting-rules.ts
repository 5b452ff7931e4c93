/** Compatible alternatives: the fitting dimensions two parts of one type must share, and how closely. */
import type { PartType } from '../../schemas/catalogue/part-types'

export interface FittingRule { key: string; tolerance?: number }

/**
 * Two parts of one type are interchangeable when these agree: numbers within `tolerance` (mm), everything else
 * equal. Tolerances are our stated catalogue rule (common practice: pad plates within half a millimetre, hydraulic
 * bores and disc sizes exact).
 */
export const FITTING_RULES: Record<PartType, FittingRule[]> = {
  disc: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'thicknessMm', tolerance: 0 }, { key: 'heightMm', tolerance: 0.5 },
    { key: 'centreBoreMm', tolerance: 0.1 }, { key: 'boltHoles' }, { key: 'pcdMm', tolerance: 0 }, { key: 'vented' }],
  pad_set: [{ key: 'axle' }, { key: 'widthMm', tolerance: 0.5 }, { key: 'heightMm', tolerance: 0.5 }, { key: 'thicknessMm', tolerance: 0.5 }],
  caliper: [{ key: 'position' }, { key: 'caliperType' }, { key: 'pistonCount' }, { key: 'pistonDiametersMm', tolerance: 0 }, { key: 'padShape' }, { key: 'parkingBrake' }],
  drum: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'widthMm', tolerance: 0.5 }, { key: 'boltHoles' }],
  shoe_set: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'widthMm', tolerance: 0.5 }, { key: 'parkingLever' }],
  wheel_cylinder: [{ key: 'axle' }, { key: 'boreMm', tolerance: 0.01 }, { key: 'side' }],
  hose: [{ key: 'position' }, { key: 'lengthMm', tolerance: 5 }, { key: 'threadA' }, { key: 'threadB' }],
  fitting_kit: [{ key: 'axle' }, { key: 'kitFor' }, { key: 'padShape' }],
  wear_sensor: [{ key: 'axle' }, { key: 'lengthMm', tolerance: 10 }, { key: 'connector' }],
  master_cylinder: [{ key: 'boreMm', tolerance: 0.01 }, { key: 'tandem' }, { key: 'ports' }],
  fluid: [{ key: 'grade' }],
}

/** True when `b` fits where `a` fits by the rules above. */
export function sameFitting(type: PartType, a: Record<string, unknown>, b: Record<string, unknown>): boolean {
  for (const rule of FITTING_RULES[type]) {
    const x = a[rule.key], y = b[rule.key]
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

/**
 * From verdicts to the part types a job needs, per axle (and per side for parts made left and right): worn discs
 * go in axle pairs with new pads, worn drums with new shoes (common practice); a hose, caliper or wheel cylinder
 * judged at a wheel is that wheel's part. Runout, leaks, pipes, the parking brake and the brake tester's figures
 * call for diagnosis first, not a part.
 */
import type { AxleName } from '../../types/axles'
import { worstVerdict, type Verdict, type WearItem, type WearItemKind } from './wear-items'

export type PartType = 'discs' | 'pads' | 'drums' | 'shoes' | 'brake-fluid' | 'hoses' | 'calipers' | 'wheel-cylinders'

/** A part type the catalogue can suggest, per axle (or for the whole system: fluid). */
export interface RecommendedPart {
  axle: AxleName | 'system'
  /** The wheel's side for parts made left and right (hoses, calipers, wheel cylinders); null for axle sets. */
  side: 'left' | 'right' | null
  partType: PartType
  verdict: Exclude<Verdict, 'ok'>
  reasons: string[]
}

const SIDED: Partial<Record<string, PartType>> = { hose: 'hoses', caliper: 'calipers', 'wheel-cylinder': 'wheel-cylinders' }
/**
 * Axle sets a verdict calls for, and the part that goes with them. Runout is left out: over its limit the hub is
 * cleaned and the disc re-checked before anything is bought (common practice).
 */
const AXLE_SETS: Partial<Record<WearItemKind, { worn: PartType; with?: PartType }>> = {
  'disc-thickness': { worn: 'discs', with: 'pads' },
  'disc-thickness-variation': { worn: 'discs', with: 'pads' },
  'pad-thickness': { worn: 'pads' },
  'drum-diameter': { worn: 'drums', with: 'shoes' },
  'shoe-lining': { worn: 'shoes' },
}
const FLUID_KINDS: ReadonlySet<WearItemKind> = new Set(['fluid-water', 'fluid-boiling-point', 'fluid-age', 'fluid-compatibility'])

/** Part types to suggest from the verdicts, merged per axle, side and part type. */
export function recommendParts(items: readonly WearItem[]): RecommendedPart[] {
  const out: RecommendedPart[] = []
  const add = (axle: RecommendedPart['axle'], side: RecommendedPart['side'], partType: PartType, verdict: Exclude<Verdict, 'ok'>, reason: string) => {
    const existing = out.find((r) => r.axle === axle && r.side === side && r.partType === partType)
    if (!existing) {
      out.push({ axle, side, partType, verdict, reasons: [reason] })
      return
    }
    existing.verdict = worstVerdict([existing.verdict, verdict]) as Exclude<Verdict, 'ok'>
    if (!existing.reasons.includes(reason)) existing.reasons.push(reason)
  }
  for (const item of items) {
    if (item.verdict === 'ok') continue
    const v = item.verdict
    const set = AXLE_SETS[item.kind]
    if (set && item.axle) {
      add(item.axle, null, set.worn, v, item.message)
      if (set.with) add(item.axle, null, set.with, v, `New ${set.worn} on the ${item.axle} axle take new ${set.with}.`)
    } else if (item.kind === 'condition') {
      const type = SIDED[item.subject]
      const side = typeof item.position === 'string' && item.position.endsWith('right') ? 'right' : 'left'
      if (type && item.axle) add(item.axle, side, type, v, item.message)
    } else if (FLUID_KINDS.has(item.kind)) {
      add('system', null, 'brake-fluid', v, item.message)
    }
  }
  return out
}

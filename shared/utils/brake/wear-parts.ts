/**
 * From verdicts to the part types a job needs, per axle (and per side for parts made left and right): worn discs
 * go in axle pairs with new pads, worn drums with new shoes (common practice); a hose, caliper or wheel cylinder
 * judged at a wheel is that wheel's part. Leaks, pipes, the parking brake and the brake tester's figures call for
 * diagnosis first, not a part.
 */
import type { AxleName } from '../../types/axles'
import { worstVerdict, type Verdict, type WearItem } from './wear-items'

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
  const withPartner = (axle: AxleName, worn: 'discs' | 'drums', v: Exclude<Verdict, 'ok'>, reason: string) => {
    const partner = worn === 'discs' ? 'pads' : 'shoes'
    add(axle, null, worn, v, reason)
    add(axle, null, partner, v, `New ${worn} on the ${axle} axle take new ${partner}.`)
  }
  for (const item of items) {
    if (item.verdict === 'ok') continue
    const v = item.verdict
    const side = typeof item.position === 'string' && item.position.endsWith('right') ? 'right' : 'left'
    switch (item.kind) {
      case 'disc-thickness':
      case 'disc-thickness-variation':
      case 'disc-runout':
        if (item.axle) withPartner(item.axle, 'discs', v, item.message)
        break
      case 'pad-thickness':
        if (item.axle) add(item.axle, null, 'pads', v, item.message)
        break
      case 'drum-diameter':
        if (item.axle) withPartner(item.axle, 'drums', v, item.message)
        break
      case 'shoe-lining':
        if (item.axle) add(item.axle, null, 'shoes', v, item.message)
        break
      case 'condition': {
        const type = SIDED[item.subject]
        if (type && item.axle) add(item.axle, side, type, v, item.message)
        break
      }
      case 'fluid-water':
      case 'fluid-boiling-point':
      case 'fluid-age':
      case 'fluid-compatibility':
        add('system', null, 'brake-fluid', v, item.message)
        break
    }
  }
  return out
}

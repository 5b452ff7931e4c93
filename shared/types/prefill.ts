/**
 * The answer of GET /api/calculations/prefill (server/services/prefill.ts), read by the bore-check and
 * inspection pages.
 */
import type { FieldIssue, HydraulicsInputRaw } from '../utils/brake'
import type { AxleName } from './axles'

export type PartRole = 'master-cylinder' | 'caliper' | 'wheel-cylinder'
type Answers = Record<string, string>

export interface OeWearLimits {
  kind: 'disc' | 'drum'
  discDiameterMm: number | null
  discThicknessMm: number | null
  discMinThicknessMm: number | null
  maxRunoutMm: number | null
  maxThicknessVariationMm: number | null
  drumDiameterMm: number | null
  drumMaxDiameterMm: number | null
}

export interface PrefillOption {
  key: string
  label: string
  question: string
  values: { value: string; label: string }[]
  /** The answer given, or implied by the part's fitment; null while open. */
  answer: string | null
  implied: boolean
}

export interface PrefillResult {
  vehicle: {
    id: number; label: string; circuitSplit: string; fluidGrade: string; tyreSize: string
    kerbMassKg: number | null; mcBoreMm: number | null
  }
  options: PrefillOption[]
  answers: Answers
  part: {
    sku: string; type: string; description: string; productLine: string; role: PartRole | null
    axle: AxleName | null; fitsVehicle: boolean; fitmentCondition: string | null
  } | null
  /** The bore-check body as far as the data goes; `missing` lists what still has to be entered. */
  hydraulics: HydraulicsInputRaw
  missing: FieldIssue[]
  assumptions: string[]
  notes: string[]
  /** OE limits per axle for the inspection form; null when the data has no brake for that axle. */
  wear: { front: OeWearLimits | null; rear: OeWearLimits | null; specifiedGrade: string | null }
}

/** How specifications read for people: a one-line summary for lists and label/value/unit rows for the part page. */
import type { PartType } from '../../schemas/catalogue/part-types'
import { SPEC_FIELDS } from '../../schemas/catalogue/spec-fields'

const n = (v: unknown) => (typeof v === 'number' ? (Number.isInteger(v) ? String(v) : String(Number(v.toFixed(2)))) : '')

/** The numbers given, joined by " × " with their unit after the last; empty when none is given. */
const dims = (unit: string, ...vs: unknown[]) => { const xs = vs.map(n).filter(Boolean); return xs.length ? `${xs.join(' × ')} ${unit}` : '' }
/** A number with its words around it, or nothing when the number is not given. */
const withNumber = (v: unknown, text: (x: string) => string) => (n(v) ? text(n(v)) : '')
const text = (v: unknown) => (typeof v === 'string' ? v : '')
const joined = (sep: string, ...xs: string[]) => xs.filter(Boolean).join(sep)

/**
 * "300 × 25 mm vented, min 23 mm", "bore 22.22 mm tandem", "DOT 4 · 1000 ml". A value not given yet (a part a price
 * file brought, before someone enters its specifications) is left out with its unit; with none the summary is empty.
 */
export function keySpecs(type: string, s: Record<string, unknown>): string {
  switch (type as PartType) {
    case 'disc': return joined(', ', joined(' ', dims('mm', s.diameterMm, s.thicknessMm), typeof s.vented === 'boolean' ? (s.vented ? 'vented' : 'solid') : ''),
      withNumber(s.minThicknessMm, (x) => `min ${x} mm`))
    case 'pad_set': return joined(', ', dims('mm', s.widthMm, s.heightMm, s.thicknessMm), text(s.frictionCode))
    case 'caliper': {
      const d = Array.isArray(s.pistonDiametersMm) ? (s.pistonDiametersMm as unknown[]).map(n).filter(Boolean).join('/') : ''
      const pistons = d ? `${n(s.pistonCount) ? `${n(s.pistonCount)} × ` : ''}${d} mm` : ''
      return joined(', ', joined(' ', text(s.caliperType), pistons), s.condition === 'remanufactured' ? 'reman' : '')
    }
    case 'drum': return joined(' ', dims('mm', s.diameterMm), withNumber(s.maxDiameterMm, (x) => `(max ${x} mm)`))
    case 'shoe_set': return dims('mm', s.diameterMm, s.widthMm)
    case 'wheel_cylinder': return withNumber(s.boreMm, (x) => `bore ${x} mm`)
    case 'master_cylinder': return joined(', ', joined(' ', withNumber(s.boreMm, (x) => `bore ${x} mm`), s.tandem ? 'tandem' : ''), s.condition === 'remanufactured' ? 'reman' : '')
    case 'hose': return joined(', ', dims('mm', s.lengthMm), text(s.threadA))
    case 'fluid': return joined(' · ', text(s.grade), withNumber(s.volumeMl, (x) => `${x} ml`))
    case 'fitting_kit': return withNumber(s.pieces, (x) => `${x} pieces`)
    case 'wear_sensor': return withNumber(s.lengthMm, (x) => `${x} mm lead`)
    default: return ''
  }
}

export interface SpecRow { key: string; label: string; value: string; unit: string }

/** The part page's specification table, in the order SPEC_FIELDS gives. */
export function specRows(type: string, s: Record<string, unknown>): SpecRow[] {
  const fields = SPEC_FIELDS[type as PartType] ?? []
  const rows: SpecRow[] = []
  for (const f of fields) {
    const v = s[f.key]
    if (v === undefined || v === null || v === '') continue
    let value: string
    if (Array.isArray(v)) value = v.map(n).join(' / ')
    else if (typeof v === 'boolean') value = v ? 'yes' : 'no'
    else if (typeof v === 'number') value = n(v)
    else value = String(v)
    rows.push({ key: f.key, label: f.label, value, unit: f.unit ?? '' })
  }
  return rows
}

/** A fitment's option qualifiers for people: `{ front_disc_diameter_mm: "300" }` -> "front disc diameter 300 mm". */
export function qualifierText(q: Record<string, string>): string {
  return Object.entries(q).map(([k, v]) => (k.endsWith('_mm') ? `${k.slice(0, -3).replace(/_/g, ' ')} ${v} mm` : `${k.replace(/_/g, ' ')} ${v}`)).join(', ')
}

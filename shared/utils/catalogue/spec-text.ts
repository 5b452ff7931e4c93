/** How specifications read for people: a one-line summary for lists and label/value/unit rows for the part page. */
import type { PartType } from '../../schemas/catalogue/part-types'
import { SPEC_FIELDS } from '../../schemas/catalogue/spec-fields'

const n = (v: unknown) => (typeof v === 'number' ? (Number.isInteger(v) ? String(v) : String(Number(v.toFixed(2)))) : '')

/** "300 × 25 mm vented", "22.22 mm tandem", "DOT 4 · 1000 ml". */
export function keySpecs(type: string, s: Record<string, unknown>): string {
  switch (type as PartType) {
    case 'disc': return `${n(s.diameterMm)} × ${n(s.thicknessMm)} mm ${s.vented ? 'vented' : 'solid'}, min ${n(s.minThicknessMm)} mm`
    case 'pad_set': return `${n(s.widthMm)} × ${n(s.heightMm)} × ${n(s.thicknessMm)} mm, ${String(s.frictionCode ?? '')}`
    case 'caliper': {
      const d = Array.isArray(s.pistonDiametersMm) ? (s.pistonDiametersMm as number[]).map(n).join('/') : ''
      return `${String(s.caliperType ?? '')} ${n(s.pistonCount)} × ${d} mm${s.condition === 'remanufactured' ? ', reman' : ''}`
    }
    case 'drum': return `${n(s.diameterMm)} mm (max ${n(s.maxDiameterMm)} mm)`
    case 'shoe_set': return `${n(s.diameterMm)} × ${n(s.widthMm)} mm`
    case 'wheel_cylinder': return `bore ${n(s.boreMm)} mm`
    case 'master_cylinder': return `bore ${n(s.boreMm)} mm${s.tandem ? ' tandem' : ''}${s.condition === 'remanufactured' ? ', reman' : ''}`
    case 'hose': return `${n(s.lengthMm)} mm, ${String(s.threadA ?? '')}`
    case 'fluid': return `${String(s.grade ?? '')} · ${n(s.volumeMl)} ml`
    case 'fitting_kit': return `${n(s.pieces)} pieces`
    case 'wear_sensor': return `${n(s.lengthMm)} mm lead`
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

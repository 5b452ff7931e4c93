/**
 * The inspection form's state and its conversion to the wear-check body (POST /api/calculations/wear, and `wear`
 * of POST /api/inspections). Blank entries are left out; `paths` maps each body path back to the form field so
 * the schema's and the server's messages land next to the right input.
 */
import type { WearInputRaw } from '#shared/utils/brake'
import type { OeWearLimits } from '#shared/types/prefill'
import type { AxleName } from '#shared/types/axles'

export type Side = 'left' | 'right'
export const READINGS_PER_DISC = 4

export interface AxleWearForm {
  kind: 'disc' | 'drum'
  /** Disc: readings per side (blank = not measured), runout per side. */
  readings: Record<Side, (number | null)[]>
  runout: Record<Side, number | null>
  /** Thickness variation measured directly; blank = worked out from the readings. */
  tv: Record<Side, number | null>
  minThicknessMm: number | null
  runoutLimitMm: number | null
  thicknessVariationLimitMm: number | null
  padInnerMm: number | null
  padOuterMm: number | null
  /** Drum: inside diameter per side. */
  drumDiameter: Record<Side, number | null>
  drumMaxDiameterMm: number | null
}

export interface InspectionForm {
  registration: string
  odometer: string
  axles: Record<AxleName, AxleWearForm>
  waterPercent: number | null
  gradeInSystem: string
  gradeToAdd: string
  specifiedGrade: string
}

export function axleWearForm(limits: OeWearLimits | null): AxleWearForm {
  const kind = limits?.kind ?? 'disc'
  return {
    kind,
    readings: { left: Array(READINGS_PER_DISC).fill(null), right: Array(READINGS_PER_DISC).fill(null) },
    runout: { left: null, right: null },
    tv: { left: null, right: null },
    minThicknessMm: limits?.discMinThicknessMm ?? null,
    runoutLimitMm: limits?.maxRunoutMm ?? null,
    thicknessVariationLimitMm: limits?.maxThicknessVariationMm ?? null,
    padInnerMm: null,
    padOuterMm: null,
    drumDiameter: { left: null, right: null },
    drumMaxDiameterMm: limits?.drumMaxDiameterMm ?? null,
  }
}

export function inspectionForm(wear: { front: OeWearLimits | null; rear: OeWearLimits | null; specifiedGrade: string | null } | null): InspectionForm {
  return {
    registration: '', odometer: '',
    axles: { front: axleWearForm(wear?.front ?? null), rear: axleWearForm(wear?.rear ?? { kind: 'disc' } as OeWearLimits) },
    waterPercent: null, gradeInSystem: wear?.specifiedGrade ?? '', gradeToAdd: '', specifiedGrade: wear?.specifiedGrade ?? '',
  }
}

/**
 * The form for new vehicle data (an option answered) keeping everything measured so far: readings stay, limits
 * follow the data. An axle whose brake kind changed starts blank (disc readings mean nothing on a drum).
 */
export function withNewLimits(old: InspectionForm, wear: Parameters<typeof inspectionForm>[0]): InspectionForm {
  const next = inspectionForm(wear)
  for (const axle of ['front', 'rear'] as const) {
    const before = old.axles[axle]
    const after = next.axles[axle]
    if (before.kind !== after.kind) continue
    next.axles[axle] = {
      ...before,
      minThicknessMm: after.minThicknessMm, runoutLimitMm: after.runoutLimitMm,
      thicknessVariationLimitMm: after.thicknessVariationLimitMm, drumMaxDiameterMm: after.drumMaxDiameterMm,
    }
  }
  return { ...next, registration: old.registration, odometer: old.odometer, waterPercent: old.waterPercent, gradeInSystem: old.gradeInSystem || next.gradeInSystem, gradeToAdd: old.gradeToAdd }
}

const given = (v: number | null | undefined): v is number => v !== null && v !== undefined

/** The body and the map from body paths (`discs[0].minThicknessMm`) to form keys (`front.minThickness`). */
export function wearBody(f: InspectionForm): { body: WearInputRaw; paths: Record<string, string> } {
  const discs: Record<string, unknown>[] = []
  const pads: Record<string, unknown>[] = []
  const drums: Record<string, unknown>[] = []
  const paths: Record<string, string> = {}
  for (const axle of ['front', 'rear'] as const) {
    const a = f.axles[axle]
    if (a.kind === 'disc') {
      for (const side of ['left', 'right'] as const) {
        const idx = a.readings[side].map((v, i) => (given(v) ? i : -1)).filter((i) => i >= 0)
        if (!idx.length && !given(a.runout[side]) && !given(a.tv[side])) continue
        const k = discs.length
        const p = `discs[${k}]`
        discs.push({
          position: `${axle}-${side}`,
          thicknessReadingsMm: idx.map((i) => a.readings[side][i]),
          ...(given(a.minThicknessMm) || Number.isNaN(a.minThicknessMm) ? { minThicknessMm: a.minThicknessMm } : {}),
          ...(given(a.runout[side]) ? { runoutMm: a.runout[side] } : {}),
          ...(given(a.tv[side]) ? { thicknessVariationMm: a.tv[side] } : {}),
          ...(given(a.runoutLimitMm) ? { runoutLimitMm: a.runoutLimitMm } : {}),
          ...(given(a.thicknessVariationLimitMm) ? { thicknessVariationLimitMm: a.thicknessVariationLimitMm } : {}),
        })
        paths[p] = `${axle}.${side}.disc`
        paths[`${p}.thicknessReadingsMm`] = `${axle}.${side}.disc`
        idx.forEach((orig, j) => { paths[`${p}.thicknessReadingsMm[${j}]`] = `${axle}.${side}.reading.${orig}` })
        paths[`${p}.minThicknessMm`] = `${axle}.minThickness`
        paths[`${p}.runoutMm`] = `${axle}.${side}.runout`
        paths[`${p}.thicknessVariationMm`] = `${axle}.${side}.tv`
        paths[`${p}.runoutLimitMm`] = `${axle}.runoutLimit`
        paths[`${p}.thicknessVariationLimitMm`] = `${axle}.tvLimit`
      }
      if (given(a.padInnerMm) || given(a.padOuterMm)) {
        const p = `pads[${pads.length}]`
        pads.push({ axle, ...(given(a.padInnerMm) ? { innerMm: a.padInnerMm } : {}), ...(given(a.padOuterMm) ? { outerMm: a.padOuterMm } : {}) })
        paths[p] = `${axle}.pads`
        paths[`${p}.innerMm`] = `${axle}.padInner`
        paths[`${p}.outerMm`] = `${axle}.padOuter`
      }
    } else {
      for (const side of ['left', 'right'] as const) {
        if (!given(a.drumDiameter[side])) continue
        const p = `drums[${drums.length}]`
        drums.push({ position: `${axle}-${side}`, diameterMm: a.drumDiameter[side], ...(given(a.drumMaxDiameterMm) ? { maxDiameterMm: a.drumMaxDiameterMm } : {}) })
        paths[p] = `${axle}.${side}.drum`
        paths[`${p}.diameterMm`] = `${axle}.${side}.drum`
        paths[`${p}.maxDiameterMm`] = `${axle}.drumMax`
      }
    }
  }
  const fluid: Record<string, unknown> = {}
  if (given(f.waterPercent)) fluid.waterPercent = f.waterPercent
  if (f.gradeToAdd) {
    fluid.gradeToAdd = f.gradeToAdd
    if (f.gradeInSystem) fluid.gradeInSystem = f.gradeInSystem
  } else if (given(f.waterPercent) && f.gradeInSystem) fluid.gradeInSystem = f.gradeInSystem
  if (Object.keys(fluid).length && f.specifiedGrade) fluid.specifiedGrade = f.specifiedGrade
  paths.fluid = 'fluid'
  paths['fluid.waterPercent'] = 'fluid.water'
  paths['fluid.gradeInSystem'] = 'fluid.inSystem'
  paths['fluid.gradeToAdd'] = 'fluid.toAdd'
  const body: Record<string, unknown> = { discs, pads, drums }
  if (Object.keys(fluid).length) body.fluid = fluid
  return { body: body as WearInputRaw, paths }
}

/**
 * Field messages keyed by form key. `raw` keys are wear paths (`discs[0].minThicknessMm`), optionally prefixed
 * `wear.`; other keys (registration, answers.x) pass through. A message for a path the form has no field for
 * goes under `_`.
 */
export function formErrors(raw: Record<string, string>, paths: Record<string, string>): Record<string, string> {
  const out: Record<string, string> = {}
  for (const [key, message] of Object.entries(raw)) {
    const path = key.replace(/^wear\.?/, '')
    const isWear = key === 'wear' || key.startsWith('wear.') || /^(discs|pads|drums|fluid)/.test(key) || key === '_'
    const target = !isWear ? key : path === '' || path === '_' ? '_' : paths[path] ?? '_'
    if (target === '_') out._ = out._ ? `${out._} ${message}` : message
    else out[target] ??= message
  }
  return out
}

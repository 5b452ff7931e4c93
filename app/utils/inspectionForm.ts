/**
 * The inspection form's state, wheel by wheel, and its conversion to the wear-check body (POST /api/calculations/wear,
 * and `wear` of POST /api/inspections). Values are kept in SI (mm, N) whatever unit is shown; blank entries are left
 * out; `paths` maps each body path back to the form field so the schema's and the server's messages land next to
 * the right input.
 */
import type { WearInputRaw } from '#shared/utils/brake'
import type { OeWearLimits } from '#shared/types/prefill'
import type { AxleName } from '#shared/types/axles'

export const WHEELS = ['front-left', 'front-right', 'rear-left', 'rear-right'] as const
export type Wheel = (typeof WHEELS)[number]
export const READINGS_PER_DISC = 4
/** What the technician looks at on each wheel besides the friction parts (the parking brake is the car's). */
export const WHEEL_CONDITIONS = ['hose', 'pipe', 'caliper', 'wheel-cylinder', 'leak'] as const
export type WheelCondition = (typeof WHEEL_CONDITIONS)[number]
export type ConditionState = '' | 'ok' | 'advise' | 'fail'

export interface ConditionForm { state: ConditionState; note: string }

export interface WheelForm {
  /** Disc: micrometer readings around the disc (blank = not measured). */
  readings: (number | null)[]
  /** Thickness variation measured as its own micrometer figure; blank = worked out from the readings. */
  tv: number | null
  runout: number | null
  padInner: number | null
  padOuter: number | null
  /** Drum: inside diameter and the thinnest shoe's lining. */
  drumDiameter: number | null
  lining: number | null
  conditions: Record<WheelCondition, ConditionForm>
}

/** The vehicle's limits for an axle (from its data; editable). */
export interface AxleLimitsForm {
  kind: 'disc' | 'drum'
  minThicknessMm: number | null
  refinishMinMm: number | null
  thicknessVariationLimitMm: number | null
  runoutLimitMm: number | null
  drumMaxDiameterMm: number | null
  machiningAllowanceMm: number | null
}

export interface InspectionForm {
  registration: string
  odometer: string
  axles: Record<AxleName, AxleLimitsForm>
  wheels: Record<Wheel, WheelForm>
  parkingBrake: ConditionForm
  fluid: {
    waterPercent: number | null
    boilingPointC: number | null
    ageMonths: number | null
    gradeInSystem: string
    gradeToAdd: string
    specifiedGrade: string
  }
  brakeTest: { massKg: number | null; service: Record<Wheel, number | null>; parking: Record<Wheel, number | null> }
}

type WearLimits = { front: OeWearLimits | null; rear: OeWearLimits | null; specifiedGrade: string | null } | null

export const axleOfWheel = (w: Wheel): AxleName => (w.startsWith('front') ? 'front' : 'rear')
const byWheel = <T>(make: () => T): Record<Wheel, T> => ({ 'front-left': make(), 'front-right': make(), 'rear-left': make(), 'rear-right': make() })

export function wheelForm(): WheelForm {
  return {
    readings: Array(READINGS_PER_DISC).fill(null), tv: null, runout: null, padInner: null, padOuter: null, drumDiameter: null, lining: null,
    conditions: Object.fromEntries(WHEEL_CONDITIONS.map((c) => [c, { state: '', note: '' }])) as Record<WheelCondition, ConditionForm>,
  }
}

export function axleLimitsForm(limits: OeWearLimits | null): AxleLimitsForm {
  return {
    kind: limits?.kind ?? 'disc',
    minThicknessMm: limits?.discMinThicknessMm ?? null,
    refinishMinMm: null,
    runoutLimitMm: limits?.maxRunoutMm ?? null,
    thicknessVariationLimitMm: limits?.maxThicknessVariationMm ?? null,
    drumMaxDiameterMm: limits?.drumMaxDiameterMm ?? null,
    machiningAllowanceMm: null,
  }
}

export function inspectionForm(wear: WearLimits, kerbMassKg: number | null = null): InspectionForm {
  return {
    registration: '', odometer: '',
    axles: { front: axleLimitsForm(wear?.front ?? null), rear: axleLimitsForm(wear?.rear ?? null) },
    wheels: byWheel(wheelForm),
    parkingBrake: { state: '', note: '' },
    fluid: { waterPercent: null, boilingPointC: null, ageMonths: null, gradeInSystem: wear?.specifiedGrade ?? '', gradeToAdd: '', specifiedGrade: wear?.specifiedGrade ?? '' },
    brakeTest: { massKg: kerbMassKg, service: byWheel(() => null), parking: byWheel(() => null) },
  }
}

/**
 * The form for new vehicle data (an option answered) keeping everything measured so far: readings stay, limits
 * follow the data. An axle whose brake kind changed starts blank (disc readings mean nothing on a drum).
 */
export function withNewLimits(old: InspectionForm, wear: WearLimits, kerbMassKg: number | null = null): InspectionForm {
  const next = inspectionForm(wear, kerbMassKg)
  for (const axle of ['front', 'rear'] as const) {
    if (old.axles[axle].kind !== next.axles[axle].kind) continue
    next.axles[axle] = { ...old.axles[axle], ...pickLimits(next.axles[axle]) }
    for (const w of WHEELS) if (axleOfWheel(w) === axle) next.wheels[w] = old.wheels[w]
  }
  return {
    ...next, registration: old.registration, odometer: old.odometer, parkingBrake: old.parkingBrake,
    fluid: { ...old.fluid, gradeInSystem: old.fluid.gradeInSystem || next.fluid.gradeInSystem, specifiedGrade: next.fluid.specifiedGrade },
    brakeTest: { ...old.brakeTest, massKg: old.brakeTest.massKg ?? next.brakeTest.massKg },
  }
}

function pickLimits(a: AxleLimitsForm) {
  return { minThicknessMm: a.minThicknessMm, runoutLimitMm: a.runoutLimitMm, thicknessVariationLimitMm: a.thicknessVariationLimitMm, drumMaxDiameterMm: a.drumMaxDiameterMm }
}

const given = (v: number | null | undefined): v is number => v !== null && v !== undefined
/** A value to send: given, or unreadable (NaN, kept so the schema says "must be a number"). */
const sent = (v: number | null | undefined) => given(v) || Number.isNaN(v)
/** `{ key: value }` for each value to send. */
const some = (o: Record<string, number | null>) => Object.fromEntries(Object.entries(o).filter(([, v]) => sent(v)))

interface Body {
  discs: Record<string, unknown>[]; pads: Record<string, unknown>[]; drums: Record<string, unknown>[]; shoes: Record<string, unknown>[]
  conditions: Record<string, unknown>[]
}

function discBody(f: InspectionForm, w: Wheel, out: Body, paths: Record<string, string>) {
  const a = f.axles[axleOfWheel(w)]
  const wheel = f.wheels[w]
  const idx = wheel.readings.map((v, i) => (sent(v) ? i : -1)).filter((i) => i >= 0)
  if (idx.length || sent(wheel.tv) || sent(wheel.runout)) {
    const p = `discs[${out.discs.length}]`
    out.discs.push({
      position: w, thicknessReadingsMm: idx.map((i) => wheel.readings[i]),
      ...some({ minThicknessMm: a.minThicknessMm, refinishMinThicknessMm: a.refinishMinMm, thicknessVariationMm: wheel.tv, runoutMm: wheel.runout, runoutLimitMm: a.runoutLimitMm, thicknessVariationLimitMm: a.thicknessVariationLimitMm }),
    })
    const axle = axleOfWheel(w)
    Object.assign(paths, {
      [p]: `${w}.disc`, [`${p}.thicknessReadingsMm`]: `${w}.disc`, [`${p}.minThicknessMm`]: `${axle}.minThickness`,
      [`${p}.refinishMinThicknessMm`]: `${axle}.refinishMin`, [`${p}.runoutMm`]: `${w}.runout`, [`${p}.thicknessVariationMm`]: `${w}.tv`,
      [`${p}.runoutLimitMm`]: `${axle}.runoutLimit`, [`${p}.thicknessVariationLimitMm`]: `${axle}.tvLimit`,
    })
    idx.forEach((orig, j) => { paths[`${p}.thicknessReadingsMm[${j}]`] = `${w}.reading.${orig}` })
  }
  if (sent(wheel.padInner) || sent(wheel.padOuter)) {
    const p = `pads[${out.pads.length}]`
    out.pads.push({ axle: axleOfWheel(w), side: w.endsWith('left') ? 'left' : 'right', ...some({ innerMm: wheel.padInner, outerMm: wheel.padOuter }) })
    Object.assign(paths, { [p]: `${w}.pads`, [`${p}.innerMm`]: `${w}.padInner`, [`${p}.outerMm`]: `${w}.padOuter` })
  }
}

function drumBody(f: InspectionForm, w: Wheel, out: Body, paths: Record<string, string>) {
  const a = f.axles[axleOfWheel(w)]
  const wheel = f.wheels[w]
  if (sent(wheel.drumDiameter)) {
    const p = `drums[${out.drums.length}]`
    out.drums.push({ position: w, ...some({ diameterMm: wheel.drumDiameter, maxDiameterMm: a.drumMaxDiameterMm, machiningAllowanceMm: a.machiningAllowanceMm }) })
    Object.assign(paths, { [p]: `${w}.drum`, [`${p}.diameterMm`]: `${w}.drum`, [`${p}.maxDiameterMm`]: `${axleOfWheel(w)}.drumMax`, [`${p}.machiningAllowanceMm`]: `${axleOfWheel(w)}.allowance` })
  }
  if (sent(wheel.lining)) {
    const p = `shoes[${out.shoes.length}]`
    out.shoes.push({ position: w, liningMm: wheel.lining })
    Object.assign(paths, { [p]: `${w}.lining`, [`${p}.liningMm`]: `${w}.lining` })
  }
}

function conditionsBody(f: InspectionForm, out: Body, paths: Record<string, string>) {
  const add = (position: string, item: string, c: ConditionForm, key: string) => {
    if (!c.state) return
    const p = `conditions[${out.conditions.length}]`
    out.conditions.push({ position, item, state: c.state, ...(c.note.trim() ? { note: c.note.trim() } : {}) })
    Object.assign(paths, { [p]: key, [`${p}.note`]: key, [`${p}.state`]: key })
  }
  for (const w of WHEELS) for (const item of WHEEL_CONDITIONS) add(w, item, f.wheels[w].conditions[item], `${w}.${item}`)
  add('system', 'parking-brake', f.parkingBrake, 'parkingBrake')
}

function fluidBody(f: InspectionForm, paths: Record<string, string>): Record<string, unknown> | null {
  const x = f.fluid
  const fluid: Record<string, unknown> = some({ waterPercent: x.waterPercent, boilingPointC: x.boilingPointC, ageMonths: x.ageMonths })
  const measured = Object.keys(fluid).length > 0
  if (x.gradeToAdd) fluid.gradeToAdd = x.gradeToAdd
  if (x.gradeInSystem && (measured || x.gradeToAdd)) fluid.gradeInSystem = x.gradeInSystem
  if (Object.keys(fluid).length && x.specifiedGrade) fluid.specifiedGrade = x.specifiedGrade
  Object.assign(paths, {
    fluid: 'fluid', 'fluid.waterPercent': 'fluid.water', 'fluid.boilingPointC': 'fluid.boiling', 'fluid.ageMonths': 'fluid.age',
    'fluid.gradeInSystem': 'fluid.inSystem', 'fluid.gradeToAdd': 'fluid.toAdd',
  })
  return Object.keys(fluid).length ? fluid : null
}

function brakeTestBody(f: InspectionForm, paths: Record<string, string>): Record<string, unknown> | null {
  const t = f.brakeTest
  const wheels = WHEELS.filter((w) => sent(t.service[w]) || sent(t.parking[w]))
  if (!wheels.length) return null
  paths.brakeTest = 'brakeTest'
  paths['brakeTest.massKg'] = 'brakeTest.mass'
  paths['brakeTest.readings'] = 'brakeTest'
  const readings = wheels.map((w, i) => {
    Object.assign(paths, { [`brakeTest.readings[${i}].serviceN`]: `brakeTest.${w}.service`, [`brakeTest.readings[${i}].parkingN`]: `brakeTest.${w}.parking`, [`brakeTest.readings[${i}]`]: `brakeTest.${w}.service` })
    return { wheel: w.replace('-', '_'), ...some({ serviceN: t.service[w], parkingN: t.parking[w] }) }
  })
  return { ...some({ massKg: t.massKg }), readings }
}

/** The body and the map from body paths (`discs[0].minThicknessMm`) to form keys (`front.minThickness`). */
export function wearBody(f: InspectionForm): { body: WearInputRaw; paths: Record<string, string> } {
  const out: Body = { discs: [], pads: [], drums: [], shoes: [], conditions: [] }
  const paths: Record<string, string> = {}
  for (const w of WHEELS) {
    if (f.axles[axleOfWheel(w)].kind === 'disc') discBody(f, w, out, paths)
    else drumBody(f, w, out, paths)
  }
  conditionsBody(f, out, paths)
  const fluid = fluidBody(f, paths)
  const brakeTest = brakeTestBody(f, paths)
  const body: Record<string, unknown> = { ...out }
  if (fluid) body.fluid = fluid
  if (brakeTest) body.brakeTest = brakeTest
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
    const isWear = key === 'wear' || key.startsWith('wear.') || /^(discs|pads|drums|shoes|conditions|fluid|brakeTest)/.test(key) || key === '_'
    const target = !isWear ? key : path === '' || path === '_' ? '_' : paths[path] ?? '_'
    if (target === '_') out._ = out._ ? `${out._} ${message}` : message
    else out[target] ??= message
  }
  return out
}

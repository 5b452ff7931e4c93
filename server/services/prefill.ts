/**
 * Builds the bore-check input from a vehicle's original-equipment data and, when a candidate part is named, the
 * replacement from that part's specifications (shared/schemas/catalogue/specs.ts). Every default filled in is
 * listed as an assumption; whatever the data lacks is listed in `missing` for the technician to enter. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Fitment, Part, Vehicle, VehicleBrake, VehicleOption } from '../models/catalogue'
import {
  nominalCoefficient, parseFrictionCode, parseTyreSize,
  type FieldIssue, type HydraulicsInputRaw,
} from '../../shared/utils/brake'
import type { PartType } from '../../shared/schemas/catalogue/part-types'
import { SPEC_SCHEMAS, axleOfSpecs, type CaliperSpecs, type MasterCylinderSpecs, type WheelCylinderSpecs } from '../../shared/schemas/catalogue/specs'
import { answerProblems, canonicalAnswers, matchQualifiers, type Answers } from '../../shared/utils/catalogue/qualifiers'
import { qualifierCondition, vehicleLabel } from './inspections'
import type { OeWearLimits, PartRole, PrefillResult } from '../../shared/types/prefill'
import type { AxleName } from '../../shared/types/axles'
import { invalidInput, notFound } from './errors'

export type { OeWearLimits, PartRole, PrefillResult }

/** Stated defaults (each appears in `assumptions` when used). */
export const PREFILL_DEFAULTS = {
  /** A firm stop; FMVSS No. 135 allows up to 500 N for its service stop (common practice). */
  pedalForceN: 300,
  /** Friction coefficient when no pad's SAE J866 code is known (common practice, mid F range). */
  frictionCoefficient: 0.38,
  /** Suspended pedal ratio when the vehicle data has none (common practice, typical 3-5:1). */
  pedalRatio: 4,
  /** Vacuum booster ratio when the vehicle data has none (common practice estimate). */
  boosterRatio: 4,
} as const

const ROLE_OF: Partial<Record<string, PartRole>> = { master_cylinder: 'master-cylinder', caliper: 'caliper', wheel_cylinder: 'wheel-cylinder' }

/** An axle or master cylinder as far as the data goes: numbers may be missing (the form asks for them). */
type Draft = Record<string, unknown>

const round3 = (n: number) => Math.round(n * 1000) / 1000

/** Picks the OE brake row per axle that the answers allow; several left -> the first, with a note. */
function chooseBrake(rows: VehicleBrake[], axle: AxleName, answers: Answers, options: VehicleOption[], notes: string[]): VehicleBrake | null {
  const candidates = rows.filter((r) => r.axle === axle && matchQualifiers(r.qualifiers ?? {}, answers) !== 'excluded')
  if (candidates.length === 0) return null
  candidates.sort((a, b) => Number(matchQualifiers(a.qualifiers ?? {}, answers) === 'open') - Number(matchQualifiers(b.qualifiers ?? {}, answers) === 'open') || a.id - b.id)
  const chosen = candidates[0]!
  if (candidates.length > 1) {
    const which = qualifierCondition(chosen.qualifiers, {}, options).condition?.replace(/^if /, '') ?? 'the first listed version'
    notes.push(`The ${axle} brake depends on an option not answered yet: figures assume ${which}. Answer the question above to choose.`)
  }
  return chosen
}

interface Friction { mu: number; text: string | null }
interface PadData { sku: string; code: string; heightMm: number | null }

/** μ for an axle from the SAE J866 code of the pad sets listed for it (first by SKU), else the stated default. */
function frictionFor(axle: AxleName, pads: PadData[]): Friction {
  for (const p of pads) {
    try {
      const code = parseFrictionCode(p.code)
      const mu = nominalCoefficient(code.normal.letter)
      if (mu !== null) {
        const range = `${code.normal.above ?? 0}-${code.normal.upTo ?? '∞'}`
        return { mu, text: `Friction coefficient ${mu} on the ${axle} axle: middle of the SAE J866 "${code.normal.letter}" range (${range}) from the edge code ${code.code} of pad set ${p.sku}.` }
      }
    } catch { /* not a J866 code: try the next pad set */ }
  }
  return { mu: PREFILL_DEFAULTS.frictionCoefficient, text: null }
}

/** The radial height of the axle's pads (first pad set by SKU that has one), for the effective radius. */
function padHeightFor(pads: PadData[]): { heightMm: number; sku: string } | null {
  const pad = pads.find((p) => p.heightMm !== null)
  return pad ? { heightMm: pad.heightMm!, sku: pad.sku } : null
}

function axleFromBrake(brake: VehicleBrake, mu: number, tyreSize: string | undefined, padHeightMm: number | undefined): Draft {
  const tyre = tyreSize ? { tyreSize } : {}
  if (brake.kind === 'drum') {
    // the layout's typical brake factor is the library's (shoe-layouts.ts), stated in its assumptions
    return { kind: 'drum', wheelCylinderBoreMm: brake.wheelCylinderBoreMm ?? undefined, drumDiameterMm: brake.drumDiameterMm ?? undefined, shoeLayout: brake.drumShoeLayout ?? undefined, ...tyre }
  }
  return {
    kind: 'disc', caliper: brake.caliperType ?? undefined, pistonDiametersMm: brake.pistonDiametersMm ?? undefined,
    discDiameterMm: brake.discDiameterMm ?? undefined, frictionCoefficient: mu,
    ...(padHeightMm !== undefined ? { padHeightMm } : {}), ...(brake.padEdgeMarginMm != null ? { edgeMarginMm: brake.padEdgeMarginMm } : {}), ...tyre,
  }
}

/**
 * The vehicle block of the check (mass, wheelbase, centre of gravity, front share, laden state, rear valve,
 * electronic distribution) when the data has it; null otherwise.
 */
function vehicleData(v: Vehicle): Draft | null {
  if (v.kerbMassKg == null || v.wheelbaseMm == null || v.cogHeightMm == null || v.frontStaticSharePercent == null) return null
  const laden = v.ladenMassKg != null && v.ladenCogHeightMm != null && v.ladenFrontSharePercent != null
    ? { laden: { massKg: v.ladenMassKg, cogHeightMm: v.ladenCogHeightMm, frontStaticSharePercent: v.ladenFrontSharePercent } }
    : {}
  const valve = v.rearValveKneeKPa != null && v.rearValveSlope != null
    ? { rearValve: { kneeKPa: v.rearValveKneeKPa, slope: v.rearValveSlope, ...(v.rearValveLadenKneeKPa != null ? { ladenKneeKPa: v.rearValveLadenKneeKPa } : {}) } }
    : {}
  return {
    massKg: v.kerbMassKg, wheelbaseMm: v.wheelbaseMm, cogHeightMm: v.cogHeightMm, frontStaticSharePercent: v.frontStaticSharePercent,
    ...laden, ...valve, ...(v.electronicDistribution != null ? { electronicDistribution: v.electronicDistribution } : {}),
  }
}

function wearLimits(brake: VehicleBrake | null): OeWearLimits | null {
  if (!brake) return null
  return {
    kind: brake.kind, discDiameterMm: brake.discDiameterMm ?? null, discThicknessMm: brake.discThicknessMm ?? null,
    discMinThicknessMm: brake.discMinThicknessMm ?? null, maxRunoutMm: brake.maxRunoutMm ?? null,
    maxThicknessVariationMm: brake.maxThicknessVariationMm ?? null, drumDiameterMm: brake.drumDiameterMm ?? null,
    drumMaxDiameterMm: brake.drumMaxDiameterMm ?? null,
  }
}

/** Field issues for values the data lacks, with the form's paths. */
function missingFields(prefix: string, draft: Draft, missing: FieldIssue[]): void {
  const need = draft.kind === 'drum'
    ? [['wheelCylinderBoreMm', 'wheel cylinder bore'], ['drumDiameterMm', 'drum diameter']]
    : draft.kind === 'disc'
      ? [['caliper', 'caliper type'], ['pistonDiametersMm', 'caliper piston diameters'], ['discDiameterMm', 'disc diameter']]
      : [['boreMm', 'master cylinder bore']]
  for (const [key, label] of need) {
    if (draft[key!] === undefined) missing.push({ field: `${prefix}.${key}`, message: `The catalogue has no ${label} for this vehicle: enter it from the vehicle maker's data.` })
  }
}

/**
 * The prefill for the bore-check and inspection pages.
 * @throws DomainError: not found for an unknown vehicle or SKU; invalid (`opt.<key>`) for an answer to an option the
 *   vehicle lacks or a value it does not offer
 */
export async function buildPrefill(vehicleId: number, sku: string | undefined, given: Answers, transaction?: Transaction): Promise<PrefillResult> {
  const vehicle = await Vehicle.findByPk(vehicleId, { transaction })
  if (!vehicle) throw notFound('Vehicle')
  const [options, brakes] = await Promise.all([
    VehicleOption.findAll({ where: { vehicleId }, order: [['id', 'ASC']], transaction }),
    VehicleBrake.findAll({ where: { vehicleId }, order: [['id', 'ASC']], transaction }),
  ])
  const problems = answerProblems(options, given)
  if (Object.keys(problems).length) throw invalidInput(problems)
  const answers = canonicalAnswers(options, given)
  const implied = new Set<string>()
  const assumptions: string[] = []
  const notes: string[] = []
  const missing: FieldIssue[] = []

  // The candidate part, and the answers its fitment implies (a caliper listed only for the 300 mm disc version).
  let part: PrefillResult['part'] = null
  let partRow: Part | null = null
  if (sku) {
    partRow = await Part.findOne({ where: { sku }, transaction })
    if (!partRow) throw notFound('Part')
    const fitments = await Fitment.findAll({ where: { vehicleId, partId: partRow.id }, order: [['id', 'ASC']], transaction })
    const fitting = fitments.filter((f) => matchQualifiers(f.qualifiers ?? {}, answers) !== 'excluded')
    const fitment = fitting[0] ?? null
    if (fitment) {
      for (const [k, v] of Object.entries(fitment.qualifiers ?? {})) {
        if (answers[k] === undefined && fitting.every((f) => (f.qualifiers ?? {})[k] === v)) { answers[k] = v; implied.add(k) }
      }
    }
    const specAxle = axleOfSpecs(partRow.type as PartType, partRow.specs ?? {})
    const fitAxle = fitment && (fitment.axle === 'front' || fitment.axle === 'rear') ? fitment.axle : null
    part = {
      sku: partRow.sku, type: partRow.type, description: partRow.description, productLine: partRow.productLine ?? '',
      role: ROLE_OF[partRow.type] ?? null, axle: fitAxle ?? specAxle, fitsVehicle: fitment !== null,
      fitmentCondition: fitment ? qualifierCondition(fitment.qualifiers, given, options).condition : null,
    }
    if (!fitment) notes.push(`${partRow.sku} is not listed as fitting this vehicle${fitments.length ? ' with the options answered' : ''}: the figures show what it would do, not that it fits.`)
    if (implied.size) {
      const which = [...implied].map((k) => {
        const o = options.find((x) => x.key === k)
        return `${o?.label ?? k} ${o?.values.find((v) => v.value === answers[k])?.label ?? answers[k]}`
      })
      notes.push(`${partRow.sku} is listed only for ${which.join(' and ')}: that option is taken as answered.`)
    }
    if (!part.role) notes.push(`A ${partRow.type.replace(/_/g, ' ')} does not change the hydraulics: only the original figures are shown.`)
  }

  // Original equipment.
  const tyre = vehicle.tyreSize && parseTyreSize(vehicle.tyreSize) ? vehicle.tyreSize : undefined
  if (!tyre) notes.push('No readable tyre size for this vehicle: the front/rear share is taken from brake torque.')
  const padSets = await Fitment.findAll({
    where: { vehicleId },
    include: [{ model: Part, as: 'part', required: true, where: { type: 'pad_set', status: 'active' } }],
    transaction,
  })
  const padsFor = (axle: AxleName) => padSets
    .filter((f) => f.axle === axle && matchQualifiers(f.qualifiers ?? {}, answers) !== 'excluded')
    .map((f) => (f as Fitment & { part: Part }).part)
    .map((p): PadData => {
      const specs = (p.specs ?? {}) as Record<string, unknown>
      return { sku: p.sku, code: String(specs.frictionCode ?? ''), heightMm: typeof specs.heightMm === 'number' ? specs.heightMm : null }
    })
    .sort((a, b) => a.sku.localeCompare(b.sku))

  const axles: Record<AxleName, Draft> = { front: {}, rear: {} }
  const chosen: Record<AxleName, VehicleBrake | null> = { front: null, rear: null }
  let defaultMu = false
  for (const name of ['front', 'rear'] as const) {
    const brake = chooseBrake(brakes, name, answers, options, notes)
    chosen[name] = brake
    if (!brake) {
      missing.push({ field: `axles.${name}`, message: `The catalogue has no original ${name} brake for this vehicle: enter it by hand.` })
      continue
    }
    const pads = padsFor(name)
    const friction = frictionFor(name, pads)
    const height = brake.kind === 'disc' ? padHeightFor(pads) : null
    if (brake.kind === 'disc') {
      if (friction.text) assumptions.push(friction.text)
      else defaultMu = true
      if (height) assumptions.push(`Pad height ${height.heightMm} mm on the ${name} axle from pad set ${height.sku}${brake.padEdgeMarginMm != null ? `, edge margin ${brake.padEdgeMarginMm} mm from the vehicle data` : ''}.`)
    }
    axles[name] = axleFromBrake(brake, friction.mu, tyre, height?.heightMm)
    missingFields(`axles.${name}`, axles[name], missing)
  }
  if (defaultMu) assumptions.push(`Friction coefficient ${PREFILL_DEFAULTS.frictionCoefficient} where no pad set with an SAE J866 code is listed (common practice).`)

  const masterCylinder: Draft = {
    boreMm: vehicle.mcBoreMm ?? undefined,
    strokeMm: vehicle.mcStrokeMm ?? undefined,
    tandem: vehicle.mcTandem ?? undefined,
  }
  missingFields('masterCylinder', masterCylinder, missing)
  assumptions.push(`Pedal force ${PREFILL_DEFAULTS.pedalForceN} N: a firm stop (common practice); FMVSS No. 135 allows up to 500 N for its service stop.`)
  if (vehicle.pedalRatio == null) assumptions.push(`Pedal ratio ${PREFILL_DEFAULTS.pedalRatio}:1, not in the vehicle data (common practice).`)
  if (vehicle.boosterRatio == null) assumptions.push(`Booster ratio ${PREFILL_DEFAULTS.boosterRatio}:1, not in the vehicle data (common practice estimate).`)
  const dynamics = vehicleData(vehicle)
  if (dynamics) {
    assumptions.push(
      `Vehicle ${vehicle.kerbMassKg} kg unladen (kerb mass)${vehicle.ladenMassKg != null ? `, ${vehicle.ladenMassKg} kg laden` : ''}; wheelbase, centre of gravity height and static front share from the vehicle data (typical of the class).`,
    )
  } else {
    if (vehicle.kerbMassKg) assumptions.push(`Vehicle mass ${vehicle.kerbMassKg} kg: kerb mass from the vehicle data (no driver or load).`)
    notes.push('The vehicle data has no wheelbase, centre of gravity or axle loads: enter them to see which axle locks first.')
  }
  if (vehicle.boosterRatio != null && vehicle.boosterRunOutKPa != null) assumptions.push(`Booster run-out ${vehicle.boosterRunOutKPa} kPa from the vehicle data (typical of the class).`)

  const hydraulics: Draft = {
    pedalForceN: PREFILL_DEFAULTS.pedalForceN,
    pedalRatio: vehicle.pedalRatio ?? PREFILL_DEFAULTS.pedalRatio,
    boosterRatio: vehicle.boosterRatio ?? PREFILL_DEFAULTS.boosterRatio,
    ...(vehicle.boosterRatio != null && vehicle.boosterRunOutKPa != null ? { boosterRunOutKPa: vehicle.boosterRunOutKPa } : {}),
    masterCylinder,
    split: vehicle.circuitSplit,
    ...(dynamics ? { vehicle: dynamics } : vehicle.kerbMassKg ? { massKg: vehicle.kerbMassKg } : {}),
    axles,
  }

  // The replacement from the part's specifications.
  if (partRow && part?.role) {
    const parsed = (SPEC_SCHEMAS[partRow.type as PartType]).safeParse(partRow.specs ?? {})
    if (!parsed.success) {
      notes.push(`The catalogue data of ${partRow.sku} is incomplete: enter the replacement figures by hand.`)
    } else if (part.role === 'master-cylinder') {
      const s = parsed.data as MasterCylinderSpecs
      hydraulics.replacement = { masterCylinder: { boreMm: s.boreMm, tandem: s.tandem, ports: s.ports } }
      if (vehicle.mcBoreMm != null) notes.push(`Master cylinder bore ${round3(vehicle.mcBoreMm)} mm (original) -> ${round3(s.boreMm)} mm (${partRow.sku}).`)
    } else if (part.axle) {
      const original = axles[part.axle]
      if (part.role === 'caliper') {
        const s = parsed.data as CaliperSpecs
        const base = original.kind === 'disc' ? original : { kind: 'disc', frictionCoefficient: PREFILL_DEFAULTS.frictionCoefficient, ...(tyre ? { tyreSize: tyre } : {}) }
        const replaced: Draft = { ...base, kind: 'disc', caliper: s.caliperType, pistonDiametersMm: [...s.pistonDiametersMm] }
        hydraulics.replacement = { axles: { [part.axle]: replaced } }
        if (original.kind !== 'disc') {
          notes.push(`The ${part.axle} axle has drum brakes: ${partRow.sku} is a caliper, so enter the disc diameter of the conversion.`)
          missingFields(`replacement.axles.${part.axle}`, replaced, missing)
        }
      } else {
        const s = parsed.data as WheelCylinderSpecs
        if (original.kind === 'drum') {
          hydraulics.replacement = { axles: { [part.axle]: { ...original, wheelCylinderBoreMm: s.boreMm } } }
        } else {
          notes.push(`The ${part.axle} axle has disc brakes: a wheel cylinder does not fit there.`)
        }
      }
    } else {
      notes.push(`The catalogue does not say which axle ${partRow.sku} is for.`)
    }
  }

  return {
    vehicle: {
      id: vehicle.id, label: vehicleLabel(vehicle), circuitSplit: vehicle.circuitSplit, fluidGrade: vehicle.fluidGrade,
      tyreSize: vehicle.tyreSize ?? '', kerbMassKg: vehicle.kerbMassKg ?? null, mcBoreMm: vehicle.mcBoreMm ?? null,
    },
    options: options.map((o) => ({
      key: o.key, label: o.label, question: o.question, values: o.values,
      answer: answers[o.key] ?? null, implied: implied.has(o.key),
    })),
    answers,
    part,
    hydraulics: hydraulics as HydraulicsInputRaw,
    missing,
    assumptions,
    notes,
    wear: { front: wearLimits(chosen.front), rear: wearLimits(chosen.rear), specifiedGrade: vehicle.fluidGrade || null },
  }
}

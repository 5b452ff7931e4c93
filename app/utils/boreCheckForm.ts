/**
 * The bore-check form's state and its conversion to the POST /api/calculations/hydraulics body. The form keeps
 * SI numbers (null = blank); the body drops blanks so the shared schema names what is missing.
 */
import type { HydraulicsInputRaw, ShoeLayout } from '#shared/utils/brake'
import type { AxleName } from '#shared/types/axles'

export interface AxleForm {
  kind: 'disc' | 'drum'
  caliper: 'fixed' | 'floating' | null
  pistonDiametersMm: (number | null)[]
  discDiameterMm: number | null
  effectiveRadiusMm: number | null
  padHeightMm: number | null
  edgeMarginMm: number | null
  frictionCoefficient: number | null
  wheelCylinderBoreMm: number | null
  drumDiameterMm: number | null
  shoeLayout: '' | ShoeLayout
  brakeFactor: number | null
  tyreSize: string
  tyreRollingRadiusMm: number | null
  pistonTravelMm: number | null
}

export interface MasterCylinderForm {
  boreMm: number | null
  strokeMm: number | null
  tandem: boolean | null
  ports: number | null
}

/** One load state: mass, centre of gravity height, static front share. */
export interface LoadStateForm {
  massKg: number | null
  cogHeightMm: number | null
  frontStaticSharePercent: number | null
}

/** The vehicle for grip and balance; blank wheelbase and geometry = mass only (deceleration, no balance). */
export interface VehicleForm extends LoadStateForm {
  wheelbaseMm: number | null
  laden: LoadStateForm
  valveKneeKPa: number | null
  valveLadenKneeKPa: number | null
  valveSlope: number | null
  electronicDistribution: boolean
}

export interface BoreCheckForm {
  pedalForceN: number | null
  pedalRatio: number | null
  boosterRatio: number | null
  boosterRunOutKPa: number | null
  tyreRoadFriction: number | null
  split: 'front-rear' | 'diagonal'
  vehicle: VehicleForm
  masterCylinder: MasterCylinderForm
  axles: Record<AxleName, AxleForm>
  /** Which parts the replacement changes. */
  replace: { masterCylinder: boolean; front: boolean; rear: boolean }
  replacement: { masterCylinder: MasterCylinderForm; axles: Record<AxleName, AxleForm> }
}

type Loose = Record<string, unknown> | undefined
const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null)

export function blankAxle(kind: 'disc' | 'drum' = 'disc'): AxleForm {
  return {
    kind, caliper: kind === 'disc' ? 'floating' : null, pistonDiametersMm: [null], discDiameterMm: null, effectiveRadiusMm: null,
    padHeightMm: null, edgeMarginMm: null, frictionCoefficient: kind === 'disc' ? 0.38 : null, wheelCylinderBoreMm: null,
    drumDiameterMm: null, shoeLayout: '', brakeFactor: null, tyreSize: '', tyreRollingRadiusMm: null, pistonTravelMm: null,
  }
}

const LAYOUTS: readonly string[] = ['leading-trailing', 'two-leading', 'duo-servo']

export function axleFromDraft(d: Loose): AxleForm {
  const kind = d?.kind === 'drum' ? 'drum' : 'disc'
  const base = blankAxle(kind)
  if (!d) return base
  const pistons = Array.isArray(d.pistonDiametersMm) ? (d.pistonDiametersMm as unknown[]).map(num) : base.pistonDiametersMm
  return {
    ...base,
    caliper: d.caliper === 'fixed' || d.caliper === 'floating' ? d.caliper : base.caliper,
    pistonDiametersMm: pistons.length ? pistons : [null],
    discDiameterMm: num(d.discDiameterMm), effectiveRadiusMm: num(d.effectiveRadiusMm),
    padHeightMm: num(d.padHeightMm), edgeMarginMm: num(d.edgeMarginMm),
    frictionCoefficient: num(d.frictionCoefficient) ?? base.frictionCoefficient,
    wheelCylinderBoreMm: num(d.wheelCylinderBoreMm), drumDiameterMm: num(d.drumDiameterMm),
    shoeLayout: typeof d.shoeLayout === 'string' && LAYOUTS.includes(d.shoeLayout) ? d.shoeLayout as ShoeLayout : '',
    brakeFactor: num(d.brakeFactor), tyreSize: typeof d.tyreSize === 'string' ? d.tyreSize : '',
    tyreRollingRadiusMm: num(d.tyreRollingRadiusMm), pistonTravelMm: num(d.pistonTravelMm),
  }
}

function loadStateFromDraft(d: Loose): LoadStateForm {
  return { massKg: num(d?.massKg), cogHeightMm: num(d?.cogHeightMm), frontStaticSharePercent: num(d?.frontStaticSharePercent) }
}

/** The vehicle block from a prefill body: its `vehicle`, or only the mass of an older body. */
function vehicleFromDraft(draft: Loose): VehicleForm {
  const v = draft?.vehicle as Loose
  const valve = v?.rearValve as Loose
  return {
    ...loadStateFromDraft(v ?? { massKg: draft?.massKg }),
    wheelbaseMm: num(v?.wheelbaseMm),
    laden: loadStateFromDraft(v?.laden as Loose),
    valveKneeKPa: num(valve?.kneeKPa), valveLadenKneeKPa: num(valve?.ladenKneeKPa), valveSlope: num(valve?.slope),
    electronicDistribution: v?.electronicDistribution === true,
  }
}

function mcFromDraft(d: Loose): MasterCylinderForm {
  return { boreMm: num(d?.boreMm), strokeMm: num(d?.strokeMm), tandem: typeof d?.tandem === 'boolean' ? d.tandem : null, ports: num(d?.ports) }
}

/** Form state from a prefill body (or a blank form). */
export function formFromDraft(draft: Loose): BoreCheckForm {
  const axles = (draft?.axles ?? {}) as Record<string, Loose>
  const rep = (draft?.replacement ?? {}) as { masterCylinder?: Loose; axles?: Record<string, Loose> }
  const front = axleFromDraft(axles.front)
  const rear = axleFromDraft(axles.rear ?? { kind: 'disc' })
  const mc = mcFromDraft(draft?.masterCylinder as Loose)
  return {
    pedalForceN: num(draft?.pedalForceN) ?? 300,
    pedalRatio: num(draft?.pedalRatio),
    boosterRatio: num(draft?.boosterRatio),
    boosterRunOutKPa: num(draft?.boosterRunOutKPa),
    tyreRoadFriction: num(draft?.tyreRoadFriction),
    split: draft?.split === 'front-rear' ? 'front-rear' : 'diagonal',
    vehicle: vehicleFromDraft(draft),
    masterCylinder: mc,
    axles: { front, rear },
    replace: { masterCylinder: !!rep.masterCylinder, front: !!rep.axles?.front, rear: !!rep.axles?.rear },
    replacement: {
      masterCylinder: rep.masterCylinder ? mcFromDraft(rep.masterCylinder) : { ...mc },
      axles: {
        front: rep.axles?.front ? axleFromDraft(rep.axles.front) : structuredClone(front),
        rear: rep.axles?.rear ? axleFromDraft(rep.axles.rear) : structuredClone(rear),
      },
    },
  }
}

/** Drops blanks; NaN (unreadable text) is kept so the schema reports "must be a number". */
function compact<T extends Record<string, unknown>>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== null && v !== '' && v !== undefined)) as Partial<T>
}

export function axleBody(a: AxleForm): Record<string, unknown> {
  const tyre = compact({ tyreSize: a.tyreSize.trim(), tyreRollingRadiusMm: a.tyreRollingRadiusMm, pistonTravelMm: a.pistonTravelMm })
  if (a.kind === 'drum') {
    return { kind: 'drum', ...compact({ wheelCylinderBoreMm: a.wheelCylinderBoreMm, drumDiameterMm: a.drumDiameterMm, shoeLayout: a.shoeLayout, brakeFactor: a.brakeFactor }), ...tyre }
  }
  return {
    kind: 'disc',
    ...compact({
      caliper: a.caliper, discDiameterMm: a.discDiameterMm, effectiveRadiusMm: a.effectiveRadiusMm,
      padHeightMm: a.padHeightMm, edgeMarginMm: a.edgeMarginMm, frictionCoefficient: a.frictionCoefficient,
    }),
    pistonDiametersMm: a.pistonDiametersMm,
    ...tyre,
  }
}

function mcBody(m: MasterCylinderForm): Record<string, unknown> {
  return compact({ boreMm: m.boreMm, strokeMm: m.strokeMm, tandem: m.tandem, ports: m.ports })
}

const anyGiven = (...values: (number | null)[]) => values.some((v) => v !== null)

/**
 * The vehicle part of the body: with any of wheelbase, centre of gravity or front share given, the whole `vehicle`
 * (so the schema names what is still missing); otherwise only the mass, for the deceleration.
 */
function vehicleBody(v: VehicleForm): Record<string, unknown> {
  if (!anyGiven(v.wheelbaseMm, v.cogHeightMm, v.frontStaticSharePercent)) return compact({ massKg: v.massKg })
  const laden = v.laden
  return {
    vehicle: {
      ...compact({ massKg: v.massKg, wheelbaseMm: v.wheelbaseMm, cogHeightMm: v.cogHeightMm, frontStaticSharePercent: v.frontStaticSharePercent }),
      ...(anyGiven(laden.massKg, laden.cogHeightMm, laden.frontStaticSharePercent) ? { laden: compact({ ...laden }) } : {}),
      ...(anyGiven(v.valveKneeKPa, v.valveSlope, v.valveLadenKneeKPa)
        ? { rearValve: compact({ kneeKPa: v.valveKneeKPa, slope: v.valveSlope, ladenKneeKPa: v.valveLadenKneeKPa }) }
        : {}),
      ...(v.electronicDistribution ? { electronicDistribution: true } : {}),
    },
  }
}

/** The request body; `pedalForceN` may be overridden (the chart's sweep). */
export function hydraulicsBody(f: BoreCheckForm, pedalForceN?: number): HydraulicsInputRaw {
  const replacement: Record<string, unknown> = {}
  if (f.replace.masterCylinder) replacement.masterCylinder = mcBody(f.replacement.masterCylinder)
  const axles: Record<string, unknown> = {}
  if (f.replace.front) axles.front = axleBody(f.replacement.axles.front)
  if (f.replace.rear) axles.rear = axleBody(f.replacement.axles.rear)
  if (Object.keys(axles).length) replacement.axles = axles
  return {
    ...compact({
      pedalForceN: pedalForceN ?? f.pedalForceN, pedalRatio: f.pedalRatio, boosterRatio: f.boosterRatio,
      boosterRunOutKPa: f.boosterRunOutKPa, tyreRoadFriction: f.tyreRoadFriction,
    }),
    ...vehicleBody(f.vehicle),
    split: f.split,
    masterCylinder: mcBody(f.masterCylinder),
    axles: { front: axleBody(f.axles.front), rear: axleBody(f.axles.rear) },
    ...(Object.keys(replacement).length ? { replacement } : {}),
  } as HydraulicsInputRaw
}

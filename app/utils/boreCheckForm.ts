/**
 * The bore-check form's state and its conversion to the POST /api/calculations/hydraulics body. The form keeps
 * SI numbers (null = blank); the body drops blanks so the shared schema names what is missing.
 */
import type { HydraulicsInputRaw } from '#shared/utils/brake'
import type { AxleName } from '#shared/types/axles'

export interface AxleForm {
  kind: 'disc' | 'drum'
  caliper: 'fixed' | 'floating' | null
  pistonDiametersMm: (number | null)[]
  discDiameterMm: number | null
  effectiveRadiusMm: number | null
  frictionCoefficient: number | null
  wheelCylinderBoreMm: number | null
  drumDiameterMm: number | null
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

export interface BoreCheckForm {
  pedalForceN: number | null
  pedalRatio: number | null
  boosterRatio: number | null
  split: 'front-rear' | 'diagonal'
  massKg: number | null
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
    frictionCoefficient: kind === 'disc' ? 0.38 : null, wheelCylinderBoreMm: null, drumDiameterMm: null,
    brakeFactor: kind === 'drum' ? 2 : null, tyreSize: '', tyreRollingRadiusMm: null, pistonTravelMm: null,
  }
}

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
    frictionCoefficient: num(d.frictionCoefficient) ?? base.frictionCoefficient,
    wheelCylinderBoreMm: num(d.wheelCylinderBoreMm), drumDiameterMm: num(d.drumDiameterMm),
    brakeFactor: num(d.brakeFactor) ?? base.brakeFactor, tyreSize: typeof d.tyreSize === 'string' ? d.tyreSize : '',
    tyreRollingRadiusMm: num(d.tyreRollingRadiusMm), pistonTravelMm: num(d.pistonTravelMm),
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
    split: draft?.split === 'front-rear' ? 'front-rear' : 'diagonal',
    massKg: num(draft?.massKg),
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
    return { kind: 'drum', ...compact({ wheelCylinderBoreMm: a.wheelCylinderBoreMm, drumDiameterMm: a.drumDiameterMm, brakeFactor: a.brakeFactor }), ...tyre }
  }
  return {
    kind: 'disc',
    ...compact({ caliper: a.caliper, discDiameterMm: a.discDiameterMm, effectiveRadiusMm: a.effectiveRadiusMm, frictionCoefficient: a.frictionCoefficient }),
    pistonDiametersMm: a.pistonDiametersMm,
    ...tyre,
  }
}

function mcBody(m: MasterCylinderForm): Record<string, unknown> {
  return compact({ boreMm: m.boreMm, strokeMm: m.strokeMm, tandem: m.tandem, ports: m.ports })
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
    ...compact({ pedalForceN: pedalForceN ?? f.pedalForceN, pedalRatio: f.pedalRatio, boosterRatio: f.boosterRatio, massKg: f.massKg }),
    split: f.split,
    masterCylinder: mcBody(f.masterCylinder),
    axles: { front: axleBody(f.axles.front), rear: axleBody(f.axles.rear) },
    ...(Object.keys(replacement).length ? { replacement } : {}),
  } as HydraulicsInputRaw
}

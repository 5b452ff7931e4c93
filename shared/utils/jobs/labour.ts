/**
 * The labour guide's operations, which operation a part line calls for, and the overlap rule: two operations
 * on one job that share their work are not two full jobs. Hours are hundredths (1.25 h = 125).
 *
 * The overlaps (common practice in workshop labour guides; the garage can always adjust the hours):
 *  - pads fitted with new discs on the same axle are part of the disc job: the pads add nothing;
 *  - shoes fitted with new drums likewise;
 *  - a caliper changed while the axle's pads or discs are done: the wheel and caliper are already off, 0.30 h less
 *    per caliper;
 *  - a wheel cylinder changed with the axle's shoes: the drum and shoes are already off, 0.30 h less each;
 *  - a caliper, hose, wheel cylinder or master cylinder changed with a fluid flush: the system is bled once, by
 *    the flush, 0.20 h less each.
 * Reductions add up and never take an operation below zero.
 */
import type { AxleName } from '../../types/axles'

export const LABOUR_OPERATIONS = [
  'front_pads', 'front_discs_pads', 'rear_pads', 'rear_discs_pads', 'rear_shoes', 'rear_drums_shoes',
  'front_caliper', 'rear_caliper', 'front_hose', 'rear_hose', 'wheel_cylinder', 'master_cylinder', 'fluid_flush',
] as const
export type LabourOperation = (typeof LABOUR_OPERATIONS)[number]

export const LABOUR_OPERATION_LABELS: Record<LabourOperation, string> = {
  front_pads: 'Front pads',
  front_discs_pads: 'Front discs and pads',
  rear_pads: 'Rear pads',
  rear_discs_pads: 'Rear discs and pads',
  rear_shoes: 'Rear shoes',
  rear_drums_shoes: 'Rear drums and shoes',
  front_caliper: 'Front caliper (each)',
  rear_caliper: 'Rear caliper (each)',
  front_hose: 'Front brake hose (each)',
  rear_hose: 'Rear brake hose (each)',
  wheel_cylinder: 'Wheel cylinder (each)',
  master_cylinder: 'Master cylinder',
  fluid_flush: 'Brake fluid flush',
}

/** Operations done once per job whatever the quantity; the others are per unit (each caliper, hose, cylinder). */
const PER_JOB = new Set<LabourOperation>(['front_pads', 'front_discs_pads', 'rear_pads', 'rear_discs_pads', 'rear_shoes', 'rear_drums_shoes', 'master_cylinder', 'fluid_flush'])

/** The operation a part line calls for (null for parts fitted within another job: kits, sensors). */
export function operationFor(partType: string, axle: AxleName | 'all' | null): LabourOperation | null {
  const rear = axle === 'rear'
  switch (partType) {
    case 'disc': return rear ? 'rear_discs_pads' : 'front_discs_pads'
    case 'pad_set': return rear ? 'rear_pads' : 'front_pads'
    case 'drum': return 'rear_drums_shoes'
    case 'shoe_set': return 'rear_shoes'
    case 'caliper': return rear ? 'rear_caliper' : 'front_caliper'
    case 'hose': return rear ? 'rear_hose' : 'front_hose'
    case 'wheel_cylinder': return 'wheel_cylinder'
    case 'master_cylinder': return 'master_cylinder'
    case 'fluid': return 'fluid_flush'
    default: return null
  }
}

export interface JobOperation { operation: LabourOperation; count: number }
export interface OverlapStep { operation: LabourOperation; count: number; guideHundredths: number; lessHundredths: number; hundredths: number; why: string[] }

interface Rule { applies: LabourOperation[]; when: LabourOperation[]; less: number | 'all'; why: string }
const RULES: Rule[] = [
  { applies: ['front_pads'], when: ['front_discs_pads'], less: 'all', why: 'fitted with the front discs' },
  { applies: ['rear_pads'], when: ['rear_discs_pads'], less: 'all', why: 'fitted with the rear discs' },
  { applies: ['rear_shoes'], when: ['rear_drums_shoes'], less: 'all', why: 'fitted with the rear drums' },
  { applies: ['front_caliper'], when: ['front_pads', 'front_discs_pads'], less: 30, why: 'wheel and caliper already off for the front pads' },
  { applies: ['rear_caliper'], when: ['rear_pads', 'rear_discs_pads'], less: 30, why: 'wheel and caliper already off for the rear pads' },
  { applies: ['wheel_cylinder'], when: ['rear_shoes', 'rear_drums_shoes'], less: 30, why: 'drum and shoes already off' },
  { applies: ['front_caliper', 'rear_caliper', 'front_hose', 'rear_hose', 'wheel_cylinder', 'master_cylinder'], when: ['fluid_flush'], less: 20, why: 'bled once by the fluid flush' },
]

/** Operations on one job, merged (a per-job operation counts once). */
export function jobOperations(ops: JobOperation[]): JobOperation[] {
  const out = new Map<LabourOperation, number>()
  for (const o of ops) out.set(o.operation, PER_JOB.has(o.operation) ? 1 : (out.get(o.operation) ?? 0) + o.count)
  return LABOUR_OPERATIONS.filter((o) => out.has(o)).map((operation) => ({ operation, count: out.get(operation)! }))
}

/**
 * The hours each operation adds to this job after the overlaps, from the guide's hours per operation (per unit
 * for per-unit operations). An operation with no guide hours is left out.
 */
export function overlapHours(ops: JobOperation[], guide: Partial<Record<LabourOperation, number>>): OverlapStep[] {
  const merged = jobOperations(ops)
  const present = new Set(merged.map((o) => o.operation))
  const steps: OverlapStep[] = []
  for (const { operation, count } of merged) {
    const per = guide[operation]
    if (per === undefined) continue
    let lessEach = 0
    const why: string[] = []
    for (const rule of RULES) {
      if (!rule.applies.includes(operation) || !rule.when.some((w) => present.has(w))) continue
      lessEach += rule.less === 'all' ? per : rule.less
      why.push(rule.why)
    }
    const eachHundredths = Math.max(0, per - lessEach)
    steps.push({ operation, count, guideHundredths: per * count, lessHundredths: (per - eachHundredths) * count, hundredths: eachHundredths * count, why })
  }
  return steps
}

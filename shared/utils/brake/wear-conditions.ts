/**
 * What the technician sees rather than measures (hoses, pipes, calipers, wheel cylinders, leaks, the parking
 * brake), and the roller brake tester's verdicts, as wear items named by their wheel.
 */
import type { ConditionCheck, ConditionItem, WheelPosition } from './wear-schemas'
import type { BrakeTestResult, BrakeTestWheel } from './brake-test'
import { axleOf, capitalised, wheelName, type WearItem } from './wear-items'

export const CONDITION_NAMES: Readonly<Record<ConditionItem, string>> = {
  hose: 'brake hose', pipe: 'brake pipe', caliper: 'caliper', 'wheel-cylinder': 'wheel cylinder', leak: 'fluid leak check', 'parking-brake': 'parking brake',
}

/** What each state of an item means and what to do (common practice). */
const CONDITION_ADVICE: Readonly<Record<ConditionItem, { advise: string; fail: string }>> = {
  hose: { advise: 'cracked or perished: renew soon', fail: 'bulging, chafed or damaged: renew before the vehicle is driven' },
  pipe: { advise: 'corroded: renew soon', fail: 'corroded through or damaged: renew before the vehicle is driven' },
  caliper: { advise: 'sticking or a split boot: overhaul or renew soon', fail: 'seized or leaking: renew before the vehicle is driven' },
  'wheel-cylinder': { advise: 'damp or sticking: renew soon', fail: 'leaking or seized: renew before the vehicle is driven' },
  leak: { advise: 'damp: trace it and check again', fail: 'fluid is leaking: trace and repair before the vehicle is driven' },
  'parking-brake': { advise: 'too much travel or uneven: adjust soon', fail: 'does not hold: repair before the vehicle is driven' },
}

/** One condition the technician recorded. */
export function checkCondition(c: ConditionCheck): WearItem {
  const wheel = c.position === 'system' ? null : (c.position as WheelPosition)
  const where = wheel ? `${capitalised(wheelName(wheel))} ${CONDITION_NAMES[c.item]}` : capitalised(CONDITION_NAMES[c.item])
  const note = c.note ? ` (${c.note})` : ''
  return {
    id: `condition:${c.position}:${c.item}`, kind: 'condition', subject: c.item, axle: wheel ? axleOf(wheel) : null, position: wheel,
    verdict: c.state,
    message: c.state === 'ok' ? `${where}: sound${note}.` : `${where}: ${CONDITION_ADVICE[c.item][c.state]}${note}.`,
    measured: null, limit: null, unit: null, limitSource: 'technician',
  }
}

const positionOf = (wheel: BrakeTestWheel | null): WheelPosition | null => (wheel ? (wheel.replace('_', '-') as WheelPosition) : null)

/** The brake tester's verdicts as wear items. */
export function brakeTestItems(result: BrakeTestResult): WearItem[] {
  return result.verdicts.map((v) => {
    const position = positionOf(v.wheel)
    const axle = v.code === 'imbalance-front' ? 'front' : v.code === 'imbalance-rear' ? 'rear' : null
    return {
      id: `brake-test:${v.code}`, kind: 'brake-test', subject: 'brake-test', axle, position,
      verdict: v.verdict, message: v.message, measured: v.measured, limit: v.limit, unit: v.unit, limitSource: 'brake tester',
    }
  })
}

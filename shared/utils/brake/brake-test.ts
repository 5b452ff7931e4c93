/**
 * Roller brake tester readings: the braking force each wheel makes on the rollers, service brake and parking
 * brake. Efficiency = sum of the braking forces / (test mass × g) × 100; imbalance on an axle = (higher − lower) /
 * higher × 100. Both formulas as the MOT Inspection Manual (DVSA, 2012) §3.8 "Method of calculating brake
 * performance" writes them. This is the computation behind POST /api/calculations/brake-test ({@link computeBrakeTest}).
 */
import { z } from 'zod'
import { STANDARD_GRAVITY_MPS2 } from './units'
import { enumOf, nonNegative, parserOf, ranged, requiredObject, uniqueBy, validInput, type ParseResult } from './schema-fields'

export const BRAKE_TEST_WHEELS = ['front_left', 'front_right', 'rear_left', 'rear_right'] as const
export type BrakeTestWheel = (typeof BRAKE_TEST_WHEELS)[number]

/**
 * Default pass marks for a car: service brake efficiency 50 % and parking brake 16 % (MOT testing notes,
 * bobmckay.co.uk "Brakes": "the majority of cars will need to achieve 50 % ... otherwise 16 %"); imbalance 30 %
 * on an axle: the DVSA manual fails a wheel giving less than 70 % of the other wheel's effort (from memory).
 */
export const BRAKE_TEST_LIMITS = { serviceEfficiencyPercent: 50, parkingEfficiencyPercent: 16, imbalancePercent: 30 } as const

/** Readings adding up to more than this share of the test weight are a unit slip (kgf or daN typed as N). */
const MAX_PLAUSIBLE_EFFICIENCY_PERCENT = 130

/** The brake tester body under a label: the route's whole body, or `brakeTest` of an inspection. */
export function brakeTestObject(label: string) {
  return requiredObject(label, {
    /** The vehicle's test mass (as the brake tester weighed it, or from the vehicle data). */
    massKg: ranged('test mass', 'kg', 400, 4500),
    readings: z
      .array(z.object({
        wheel: enumOf('wheel', BRAKE_TEST_WHEELS),
        serviceN: nonNegative('service brake force', 'N', 20000),
        parkingN: nonNegative('parking brake force', 'N', 20000).optional(),
      }), { error: 'readings must be a list' })
      .min(1, { error: 'at least one wheel reading is required' })
      .max(4, { error: 'at most 4 wheel readings' })
      .superRefine(uniqueBy('wheel', (r: { wheel: string }) => r.wheel)),
    /** Pass marks other than the defaults (another class of vehicle, another country's test). */
    limits: z.object({
      serviceEfficiencyPercent: ranged('service efficiency limit', '%', 10, 100).optional(),
      parkingEfficiencyPercent: ranged('parking efficiency limit', '%', 5, 100).optional(),
      imbalancePercent: ranged('imbalance limit', '%', 5, 100).optional(),
    }, { error: 'limits must be an object' }).strict().optional(),
  }).strict().superRefine((body, ctx) => {
    const weight = body.massKg * STANDARD_GRAVITY_MPS2
    const total = body.readings.reduce((s, r) => s + r.serviceN, 0)
    if ((total / weight) * 100 > MAX_PLAUSIBLE_EFFICIENCY_PERCENT) {
      ctx.addIssue({
        code: 'custom', path: ['readings'],
        message: `the service readings add up to ${Math.round((total / weight) * 100)} % of the test weight; a roller tester reads at most about 100 %: check the unit (N, not kgf or daN) and the test mass`,
      })
    }
  })
}

export const brakeTestSchema = brakeTestObject('request body')

export type BrakeTestInput = z.infer<typeof brakeTestSchema>
export type BrakeTestInputRaw = z.input<typeof brakeTestSchema>
export const parseBrakeTestInput: (body: unknown) => ParseResult<BrakeTestInput> = parserOf(brakeTestSchema)

export interface BrakeTestVerdict {
  code: 'service-efficiency' | 'parking-efficiency' | 'imbalance-front' | 'imbalance-rear'
  verdict: 'ok' | 'advise' | 'fail'
  message: string
  measured: number
  limit: number
  unit: '%'
  /** The wheel the verdict points at (the weaker wheel of an unbalanced axle), else null. */
  wheel: BrakeTestWheel | null
}

/** The answer of POST /api/calculations/brake-test. */
export interface BrakeTestResult {
  serviceEfficiencyPercent: number
  parkingEfficiencyPercent: number | null
  imbalancePercent: { front: number | null; rear: number | null }
  verdicts: BrakeTestVerdict[]
  limits: { serviceEfficiencyPercent: number; parkingEfficiencyPercent: number; imbalancePercent: number }
  inputs: BrakeTestInput
  assumptions: string[]
}

/** Efficiency: sum of braking forces / (m g) × 100. */
export function brakeEfficiencyPercent(forcesN: readonly number[], massKg: number): number {
  return (forcesN.reduce((s, f) => s + f, 0) / (massKg * STANDARD_GRAVITY_MPS2)) * 100
}

/** Imbalance on an axle: (higher − lower) / higher × 100; 0 when neither wheel brakes. */
export function imbalancePercent(a: number, b: number): number {
  const high = Math.max(a, b)
  return high === 0 ? 0 : (Math.abs(a - b) / high) * 100
}

export const WHEEL_NAMES: Readonly<Record<BrakeTestWheel, string>> = {
  front_left: 'front left', front_right: 'front right', rear_left: 'rear left', rear_right: 'rear right',
}
const kN = (n: number) => `${(n / 1000).toFixed(2)} kN`
const pc = (n: number) => `${n.toFixed(1)} %`

function axleImbalance(input: BrakeTestInput, axle: 'front' | 'rear', limit: number): { value: number | null; verdict: BrakeTestVerdict | null } {
  const left = input.readings.find((r) => r.wheel === `${axle}_left`)
  const right = input.readings.find((r) => r.wheel === `${axle}_right`)
  if (!left || !right) return { value: null, verdict: null }
  const value = imbalancePercent(left.serviceN, right.serviceN)
  const weaker = left.serviceN <= right.serviceN ? left : right
  const stronger = weaker === left ? right : left
  const over = value > limit
  // the steered axle pulls the car off line: a failure there; an uneven rear is advised (common practice)
  const verdict = over ? (axle === 'front' ? 'fail' : 'advise') : 'ok'
  return {
    value,
    verdict: {
      code: `imbalance-${axle}`, verdict, measured: value, limit, unit: '%', wheel: over ? weaker.wheel : null,
      message: over
        ? `The ${WHEEL_NAMES[weaker.wheel]} brake gives ${kN(weaker.serviceN)} against ${kN(stronger.serviceN)} on the ${WHEEL_NAMES[stronger.wheel]}: ${pc(value)} imbalance, over ${limit} %. Check the ${WHEEL_NAMES[weaker.wheel]} caliper or wheel cylinder, hose and linings for sticking or contamination.`
        : `${axle === 'front' ? 'Front' : 'Rear'} axle imbalance ${pc(value)}, within ${limit} %.`,
    },
  }
}

/**
 * Efficiency and imbalance from roller brake tester readings, judged against the limits.
 * @throws BrakeInputError (with field issues) when the input fails the schema.
 */
export function computeBrakeTest(raw: BrakeTestInputRaw): BrakeTestResult {
  const input = validInput(parseBrakeTestInput, raw)
  const limits = { ...BRAKE_TEST_LIMITS, ...input.limits }
  const service = brakeEfficiencyPercent(input.readings.map((r) => r.serviceN), input.massKg)
  const parkingReadings = input.readings.filter((r) => r.parkingN !== undefined)
  const parking = parkingReadings.length ? brakeEfficiencyPercent(parkingReadings.map((r) => r.parkingN!), input.massKg) : null
  const verdicts: BrakeTestVerdict[] = [{
    code: 'service-efficiency', verdict: service >= limits.serviceEfficiencyPercent ? 'ok' : 'fail', measured: service,
    limit: limits.serviceEfficiencyPercent, unit: '%', wheel: null,
    message: service >= limits.serviceEfficiencyPercent
      ? `Service brake efficiency ${pc(service)}, at least the ${limits.serviceEfficiencyPercent} % needed.`
      : `Service brake efficiency ${pc(service)}, under the ${limits.serviceEfficiencyPercent} % needed: the brakes do not stop the vehicle as they must.`,
  }]
  if (parking !== null) {
    verdicts.push({
      code: 'parking-efficiency', verdict: parking >= limits.parkingEfficiencyPercent ? 'ok' : 'fail', measured: parking,
      limit: limits.parkingEfficiencyPercent, unit: '%', wheel: null,
      message: parking >= limits.parkingEfficiencyPercent
        ? `Parking brake efficiency ${pc(parking)}, at least the ${limits.parkingEfficiencyPercent} % needed.`
        : `Parking brake efficiency ${pc(parking)}, under the ${limits.parkingEfficiencyPercent} % needed: adjust or repair the parking brake.`,
    })
  }
  const front = axleImbalance(input, 'front', limits.imbalancePercent)
  const rear = axleImbalance(input, 'rear', limits.imbalancePercent)
  for (const v of [front.verdict, rear.verdict]) if (v) verdicts.push(v)
  const assumptions = [
    'Efficiency = sum of the braking forces / (test mass × 9.80665 m/s²); imbalance = (higher − lower) / higher on each axle (MOT Inspection Manual, DVSA, §3.8).',
  ]
  if (input.readings.length < 4) assumptions.push(`Only ${input.readings.length} of 4 wheels were read: the efficiency counts those wheels only.`)
  return {
    serviceEfficiencyPercent: service,
    parkingEfficiencyPercent: parking,
    imbalancePercent: { front: front.value, rear: rear.value },
    verdicts,
    limits,
    inputs: input,
    assumptions,
  }
}

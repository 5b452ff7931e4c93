/**
 * Words the owner reads, in one place so the owner's page, the PDF and the e-mail say the same thing.
 */

/** The safety caution on every quote the owner sees (page, PDF, e-mail). */
export const QUOTE_SAFETY_CAUTION = [
  'Brakes are safety-critical.',
  'Lines marked "required" put right faults that make the brakes unsafe or fail the roadworthiness test; declining one means driving on with that fault.',
  'The measurements and verdicts are guidance: the vehicle maker\'s data and the technician\'s judgement at the car decide, and the brakes are tested before the vehicle is handed back.',
].join(' ')

/** Plain words for an inspection verdict, for people who are not technicians. */
export const FINDING_WORDS = {
  fail: 'Needs doing now',
  advise: 'Worth doing soon',
} as const

export const RECOMMENDATION_WORDS = {
  required: 'Required for safety',
  advised: 'Advised',
} as const

/** What a wear check found, in words for the vehicle's owner (the technician's wording stays on the inspection). */
export function plainFinding(item: {
  kind: string; verdict: string; position: string | null; axle: string | null; measured: number | null; limit: number | null; unit: string | null; message: string
}): string {
  const where = (item.position ?? item.axle ?? '').replace(/[-:]/g, ' ').replace(/\s+/g, ' ').trim()
  const n = (v: number | null) => (v == null ? '' : `${Number(v.toFixed(2))}${item.unit === '%' ? ' %' : ` ${item.unit ?? 'mm'}`}`)
  const fail = item.verdict === 'fail'
  switch (item.kind) {
    case 'disc-thickness':
      return fail
        ? `The ${where} brake disc has worn thinner than its safe minimum (${n(item.measured)}; the minimum is ${n(item.limit)}). It has to be replaced, with its partner on the same axle.`
        : `The ${where} brake disc is close to its minimum thickness (${n(item.measured)}; the minimum is ${n(item.limit)}).`
    case 'disc-thickness-variation':
      return `The ${where} brake disc is uneven in thickness, which makes the brakes judder or pulse.`
    case 'disc-runout':
      return `The ${where} brake disc wobbles as it turns, which makes the brakes judder.`
    case 'pad-thickness':
      return fail
        ? `The ${where} brake pads are worn down to ${n(item.measured)}: too thin to be safe.`
        : `The ${where} brake pads are getting thin (${n(item.measured)} left).`
    case 'drum-diameter':
      return `The ${where} brake drum is worn past its largest safe size (${n(item.measured)}; the limit is ${n(item.limit)}).`
    case 'fluid-water':
      return fail
        ? `The brake fluid has taken up too much water (${n(item.measured)}). Wet fluid boils sooner, so the brakes can fade when they get hot.`
        : `The brake fluid has taken up some water (${n(item.measured)}); it is due for a change.`
    case 'fluid-compatibility':
      return 'The brake fluid in the system is not a kind that may be mixed with the one specified for this vehicle: the system needs flushing and refilling.'
    default:
      return item.message
  }
}

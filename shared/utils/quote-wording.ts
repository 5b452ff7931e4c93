/**
 * Words the owner reads, in one place so the owner's page, the PDF and the e-mail say the same thing. The severity
 * words are the one scale of the inspection too (brake/severity.ts).
 */
import { SEVERITY_SCALE, severityWord } from './brake/severity'

/** The safety caution on every quote the owner sees (page, PDF, e-mail). */
export const QUOTE_SAFETY_CAUTION = [
  'Brakes are safety-critical.',
  `Lines marked "${SEVERITY_SCALE.fail.word}" put right faults that make the brakes unsafe or fail the roadworthiness test; declining one means driving on with that fault.`,
  'The measurements and verdicts are guidance: the vehicle maker\'s data and the technician\'s judgement at the car decide, and the brakes are tested before the vehicle is handed back.',
].join(' ')

/** The scale's words for an inspection finding. */
export const FINDING_WORDS = {
  fail: severityWord('fail'),
  advise: severityWord('advise'),
} as const

/** The scale's words for a quote line's recommendation (a `required` line is a "fail" finding put right). */
export const RECOMMENDATION_WORDS = {
  required: severityWord('required'),
  advised: severityWord('advised'),
} as const

const CONDITION_WORDS: Record<string, string> = {
  hose: 'brake hose', pipe: 'brake pipe', caliper: 'brake caliper', 'wheel-cylinder': 'wheel cylinder', leak: 'brakes', 'parking-brake': 'parking brake',
}

/** What a wear check found, in words for the vehicle's owner (the technician's wording stays on the inspection). */
export function plainFinding(item: {
  id?: string; kind: string; verdict: string; position: string | null; axle: string | null; measured: number | null; limit: number | null; unit: string | null; message: string; subject?: string
}): string {
  const where = (item.position ?? item.axle ?? '').replace(/[-:]/g, ' ').replace(/\s+/g, ' ').trim()
  const n = (v: number | null) => (v == null ? '' : `${Number(v.toFixed(2))}${item.unit === '%' ? ' %' : ` ${item.unit ?? 'mm'}`}`)
  const fail = item.verdict === 'fail'
  switch (item.kind) {
    case 'disc-thickness':
      return fail
        ? `The ${where} brake disc has worn thinner than its safe minimum (${n(item.measured)}; the minimum is ${n(item.limit)}). It has to be replaced, with its partner on the same axle.`
        : `The ${where} brake disc is close to its minimum thickness (${n(item.measured)}; the minimum is ${n(item.limit)}): it is best renewed with the pads.`
    case 'disc-thickness-variation':
      return `The ${where} brake disc is uneven in thickness, which makes the brakes judder or pulse. It is checked again after cleaning the hub; if it stays uneven it needs renewing.`
    case 'disc-runout':
      return `The ${where} brake disc wobbles as it turns, which makes the brakes judder. It is checked again after cleaning the hub; if it still wobbles it needs renewing.`
    case 'pad-thickness':
      return fail
        ? `The ${where} brake pads are worn down to ${n(item.measured)}: too thin to be safe.`
        : `The ${where} brake pads are getting thin (${n(item.measured)} left).`
    case 'pad-wear-uneven':
      return `The ${where} brake pads are wearing unevenly, a sign that the brake is sticking: the caliper needs checking when the pads are renewed.`
    case 'pad-wear-sides':
      return `The brake pads on the ${where} wheel are wearing faster than on the other side, a sign that this brake drags.`
    case 'drum-diameter':
      return fail
        ? `The ${where} brake drum is worn past its largest safe size (${n(item.measured)}; the limit is ${n(item.limit)}).`
        : `The ${where} brake drum is close to its largest safe size (${n(item.measured)}; the limit is ${n(item.limit)}): it can't be skimmed again.`
    case 'shoe-lining':
      return fail
        ? `The ${where} brake shoes are worn down to ${n(item.measured)} of lining: too thin to be safe.`
        : `The ${where} brake shoes are getting thin (${n(item.measured)} of lining left).`
    case 'condition': {
      const what = CONDITION_WORDS[item.subject ?? ''] ?? 'brake part'
      const at = where ? `The ${where} ${what}` : `The ${what}`
      if (item.subject === 'leak') return fail ? `Brake fluid is leaking${where ? ` at the ${where} wheel` : ''}: it has to be found and repaired.` : `There is a damp patch of brake fluid${where ? ` at the ${where} wheel` : ''}: it is worth tracing before it becomes a leak.`
      return fail ? `${at} is damaged and not safe: it has to be renewed.` : `${at} is worn and due for renewal.`
    }
    case 'fluid-water':
      return fail
        ? `The brake fluid has taken up too much water (${n(item.measured)}). Wet fluid boils sooner, so the brakes can fade when they get hot.`
        : `The brake fluid has taken up some water (${n(item.measured)}); it is due for a change.`
    case 'fluid-boiling-point':
      return fail
        ? `The brake fluid boils too easily (at ${n(item.measured)}): the brakes can fade when they get hot. It has to be changed.`
        : `The brake fluid boils sooner than new fluid (at ${n(item.measured)}); it is due for a change.`
    case 'fluid-age':
      return `The brake fluid is ${n(item.measured)} old; most makers ask for new fluid every 2 years.`
    case 'fluid-compatibility':
      return 'The brake fluid in the system is not a kind that may be mixed with the one specified for this vehicle: the system needs flushing and refilling.'
    case 'brake-test':
      return item.axle
        ? `On the brake tester the ${where} brake pulls less than the one on the other side (${n(item.measured)} difference), so the car can pull to one side when braking.`
        : item.id === 'brake-test:parking-efficiency'
          ? `On the brake tester the parking brake held with ${n(item.measured)} of the car's weight; ${n(item.limit)} is needed.`
          : `On the brake tester the brakes stopped with ${n(item.measured)} of the car's weight; ${n(item.limit)} is needed.`
    default:
      return item.message
  }
}

/**
 * A catalogue part's description as the vehicle owner reads it: without the trade detail meant for the garage and
 * the counter: the vehicles it is listed for (", for Make Model, ..."), the pad shape code it fits, the friction
 * code in brackets ("(FF)") and the SKU a deposit belongs to. Sizes and what the part is stay.
 */
export function ownerPartWords(kind: string, description: string): string {
  if (kind === 'core_deposit') return 'Exchange deposit on the old unit'
  if (kind !== 'part') return description
  const forVehicles = description.lastIndexOf(', for ')
  const plain = (forVehicles > 0 ? description.slice(0, forVehicles) : description)
    .replace(/\s+for pad shape \S+/gi, '')
    .replace(/\s+\([A-Z]{2}\)/g, '')
    .replace(/\s{2,}/g, ' ')
    .trim()
  return plain || description
}

/**
 * Fitment qualifiers: a fitment may hold `{ option key: value }` (e.g. `{ front_disc_diameter_mm: "300" }`), tied
 * to the option questions of its vehicle. The technician's answers narrow the list: a fitment is kept while each
 * of its qualifiers is either unanswered (the question stays open) or answered with the same value.
 *
 * Besides options, a fitment may carry the car's identity as breakpoints: `vin` (a VIN pattern, `*` for any one
 * character) and `built_from` / `built_to` (year and month, 'YYYY-MM', inclusive). They are answered by the car's
 * own `vin` and `built` (its build month), never asked as questions.
 */
import { VIN_PATTERN, vinMatchesPattern } from '../vehicles/vin'

export type Qualifiers = Record<string, string>
export type Answers = Record<string, string>

export interface OptionQuestion {
  key: string
  label: string
  question: string
  values: { value: string; label: string }[]
}

export type QualifierMatch = 'fits' | 'open' | 'excluded'

/** The identity breakpoints a fitment may carry, and the answer each is compared with. */
export const IDENTITY_QUALIFIERS = { vin: 'vin', built_from: 'built', built_to: 'built' } as const
/** The identity answers a car brings (its VIN and build month); they answer breakpoints, not option questions. */
export const IDENTITY_ANSWERS = ['vin', 'built'] as const
export const IDENTITY_LABELS: Record<string, string> = { vin: 'VIN', built: 'Built', built_from: 'Built from', built_to: 'Built up to' }
const MONTH = /^(19|20)[0-9]{2}-(0[1-9]|1[0-2])$/

const isIdentityQualifier = (key: string): key is keyof typeof IDENTITY_QUALIFIERS => Object.hasOwn(IDENTITY_QUALIFIERS, key)
const isIdentityAnswer = (key: string) => (IDENTITY_ANSWERS as readonly string[]).includes(key)

/** The answer a qualifier is compared with (its own key for options, the car's VIN or build month for breakpoints). */
export function answerFor(key: string, answers: Answers): string | undefined {
  return answers[isIdentityQualifier(key) ? IDENTITY_QUALIFIERS[key] : key]
}

function identityFits(key: keyof typeof IDENTITY_QUALIFIERS, value: string, answer: string): boolean {
  if (key === 'vin') return vinMatchesPattern(answer.toUpperCase(), value)
  return key === 'built_from' ? answer >= value : answer <= value
}

/** How a fitment's qualifiers stand against the answers given so far. */
export function matchQualifiers(qualifiers: Qualifiers, answers: Answers): QualifierMatch {
  let open = false
  for (const [key, value] of Object.entries(qualifiers)) {
    const answer = answerFor(key, answers)
    if (answer === undefined) open = true
    else if (isIdentityQualifier(key) ? !identityFits(key, value, answer) : !sameValue(answer, value)) return 'excluded'
  }
  return open ? 'open' : 'fits'
}

/** Why an identity value (a breakpoint or the car's own VIN / build month) is malformed, or null. */
function identityProblem(key: string, value: string): string | null {
  if (key === 'vin') {
    return VIN_PATTERN.test(value.toUpperCase()) ? null : 'a VIN pattern is 1 to 17 VIN characters, * for any one'
  }
  return MONTH.test(value) ? null : `${IDENTITY_LABELS[key]} is a year and month, e.g. 2016-03`
}

/** "300" and "300.0" are the same option value; text values compare case-insensitively. */
export function sameValue(a: string, b: string): boolean {
  if (a === b) return true
  const x = Number(a), y = Number(b)
  if (a.trim() !== '' && b.trim() !== '' && Number.isFinite(x) && Number.isFinite(y)) return x === y
  return a.trim().toLowerCase() === b.trim().toLowerCase()
}

/**
 * Problems with answers for a vehicle's options, keyed `opt.<key>` like the query parameter that carried them:
 * an answer to a question the vehicle does not have, or a value it does not offer.
 */
export function answerProblems(options: OptionQuestion[], answers: Answers): Record<string, string> {
  const problems: Record<string, string> = {}
  for (const [key, value] of Object.entries(answers)) {
    const option = options.find((o) => o.key === key)
    if (isIdentityQualifier(key) || isIdentityAnswer(key)) {
      const problem = identityProblem(key, value)
      if (problem) problems[`opt.${key}`] = problem
    } else if (!option) {
      problems[`opt.${key}`] = options.length
        ? `this vehicle has no option "${key}" (it has ${options.map((o) => o.key).join(', ')})`
        : `this vehicle has no option "${key}"`
    } else if (!option.values.some((v) => sameValue(v.value, value))) {
      problems[`opt.${key}`] = `${option.label} must be one of ${option.values.map((v) => v.value).join(', ')}`
    }
  }
  return problems
}

/** Answers with each value spelled as the vehicle's option spells it (so "300.0" reads back as "300"). */
export function canonicalAnswers(options: OptionQuestion[], answers: Answers): Answers {
  const out: Answers = {}
  for (const [key, value] of Object.entries(answers)) {
    const v = options.find((o) => o.key === key)?.values.find((x) => sameValue(x.value, value))
    out[key] = v ? v.value : isIdentityQualifier(key) || isIdentityAnswer(key) ? value.toUpperCase() : value
  }
  return out
}

export interface OpenQuestion extends OptionQuestion {
  /** per value: how many of the listed fitments would remain with that answer */
  values: { value: string; label: string; count: number }[]
}

/**
 * The questions still worth asking: unanswered options that at least one remaining fitment depends on, with
 * how many fitments each answer would keep. Options no fitment depends on are not asked.
 */
export function openQuestions(options: OptionQuestion[], fitments: { qualifiers: Qualifiers }[], answers: Answers): OpenQuestion[] {
  const remaining = fitments.filter((f) => matchQualifiers(f.qualifiers, answers) !== 'excluded')
  const out: OpenQuestion[] = []
  for (const option of options) {
    if (answers[option.key] !== undefined || isIdentityQualifier(option.key) || isIdentityAnswer(option.key)) continue
    if (!remaining.some((f) => f.qualifiers[option.key] !== undefined)) continue
    out.push({
      ...option,
      values: option.values.map((v) => ({
        ...v,
        count: remaining.filter((f) => matchQualifiers(f.qualifiers, { ...answers, [option.key]: v.value }) !== 'excluded').length,
      })),
    })
  }
  return out
}

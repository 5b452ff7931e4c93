/**
 * Fitment qualifiers: a fitment may hold `{ option key: value }` (e.g. `{ front_disc_diameter_mm: "300" }`), tied
 * to the option questions of its vehicle. The technician's answers narrow the list: a fitment is kept while each
 * of its qualifiers is either unanswered (the question stays open) or answered with the same value.
 */

export type Qualifiers = Record<string, string>
export type Answers = Record<string, string>

export interface OptionQuestion {
  key: string
  label: string
  question: string
  values: { value: string; label: string }[]
}

export type QualifierMatch = 'fits' | 'open' | 'excluded'

/** How a fitment's qualifiers stand against the answers given so far. */
export function matchQualifiers(qualifiers: Qualifiers, answers: Answers): QualifierMatch {
  let open = false
  for (const [key, value] of Object.entries(qualifiers)) {
    const answer = answers[key]
    if (answer === undefined) open = true
    else if (!sameValue(answer, value)) return 'excluded'
  }
  return open ? 'open' : 'fits'
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
    if (!option) {
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
    out[key] = v ? v.value : value
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
    if (answers[option.key] !== undefined) continue
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

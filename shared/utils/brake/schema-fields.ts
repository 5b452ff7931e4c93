/**
 * What every brake input schema is built from: field builders whose messages name the quantity and the range,
 * the field issue shape for a 422, and the parse helpers. Ranges are plausibility limits for cars and light vans
 * (common practice): a value outside them is refused with the range named, so nothing is computed from a unit
 * slip (a bore typed in inches, a mass in tonnes).
 */
import { z } from 'zod'

/** One problem with an input, for a 422 response and for showing next to the form field. */
export interface FieldIssue {
  /** Dotted path of the field, e.g. `axles.front.frictionCoefficient` or `axles.front.pistonDiametersMm[1]`. */
  field: string
  message: string
}

/** Thrown by the compute functions when their input does not pass the schema. */
export class BrakeInputError extends Error {
  readonly issues: FieldIssue[]
  constructor(issues: FieldIssue[]) {
    super(issues.map((i) => `${i.field}: ${i.message}`).join('; '))
    this.name = 'BrakeInputError'
    this.issues = issues
  }
}

const pathText = (path: readonly PropertyKey[]) =>
  path.map((p, i) => (typeof p === 'number' ? `[${p}]` : `${i === 0 ? '' : '.'}${String(p)}`)).join('')

/** Turns a zod error into field issues (`a.b[0].c`); a strict object's unknown keys are named one by one. */
export function fieldIssues(error: z.ZodError): FieldIssue[] {
  return error.issues.flatMap((issue) => {
    const at = pathText(issue.path)
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((k) => ({ field: at ? `${at}.${k}` : k, message: 'This field cannot be set here.' }))
    }
    return [{ field: at || '(body)', message: issue.message }]
  })
}

export function requiredNumber(label: string) {
  return z.number({
    error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be a number`),
  })
}

const withUnit = (n: number, unit: string) => (unit === '' ? String(n) : unit === '%' ? `${n} %` : `${n} ${unit}`)

/**
 * A quantity that must lie in the range cars have. Zero or less reads "must be greater than 0"; otherwise the
 * message names the whole range, so the technician sees what is expected.
 */
export function ranged(label: string, unit: string, min: number, max: number) {
  const range = `${label} must be between ${withUnit(min, unit)} and ${withUnit(max, unit)}`
  return requiredNumber(label)
    .gt(0, { error: `${label} must be greater than 0${unit ? ` ${unit}` : ''}`, abort: true })
    .min(min, { error: `${range} (check the unit)` })
    .max(max, { error: `${range} (check the unit)` })
}

/** A quantity that may be zero (a worn-out pad measures 0 mm). */
export function nonNegative(label: string, unit: string, max: number) {
  return requiredNumber(label)
    .min(0, { error: `${label} can't be negative`, abort: true })
    .max(max, { error: `${label} must be at most ${withUnit(max, unit)} (check the unit)` })
}

export function requiredObject<T extends z.ZodRawShape>(label: string, shape: T) {
  return z.object(shape, {
    error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be an object`),
  })
}

export function enumOf<const T extends readonly [string, ...string[]]>(label: string, values: T) {
  const list = values.map((v) => `"${v}"`).join(' or ')
  return z.enum(values, {
    error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be ${list}`),
  })
}

/** Refuses the second entry with the same key (`disc front-left is listed twice`). */
export function uniqueBy<T>(label: string, key: (item: T) => string) {
  return (items: T[], ctx: z.RefinementCtx) => {
    const seen = new Set<string>()
    items.forEach((item, i) => {
      const k = key(item)
      if (seen.has(k)) ctx.addIssue({ code: 'custom', path: [i], message: `${label} ${k} is listed twice` })
      seen.add(k)
    })
  }
}

/** Result of a parse: the data, or the field issues for a 422. */
export type ParseResult<T> = { ok: true; data: T } | { ok: false; issues: FieldIssue[] }

export function parserOf<T>(schema: z.ZodType<T>): (body: unknown) => ParseResult<T> {
  return (body) => {
    const r = schema.safeParse(body)
    return r.success ? { ok: true, data: r.data } : { ok: false, issues: fieldIssues(r.error) }
  }
}

/**
 * The validated input of a computation.
 * @throws BrakeInputError (with field issues) when it does not pass: nothing is computed from half an input.
 */
export function validInput<T>(parse: (body: unknown) => ParseResult<T>, raw: unknown): T {
  const parsed = parse(raw)
  if (!parsed.ok) throw new BrakeInputError(parsed.issues)
  return parsed.data
}

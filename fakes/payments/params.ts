/**
 * Request parameters checked with zod: pieces for the form-encoded fields (every value arrives as a string) and
 * `parse`, which answers the first problem in the API's wording, naming the bracketed parameter
 * (`line_items[0][quantity]`), as the SDK surfaces `param` to the caller.
 */
import { z } from 'zod'
import { missing, paramError, type ApiError } from './errors'
import type { FormObject } from './form'

type Path = readonly PropertyKey[]

/** ['line_items', 0, 'quantity'] -> `line_items[0][quantity]` */
function paramName(path: Path): string {
  return path.map((s, i) => (i === 0 ? String(s) : `[${String(s)}]`)).join('')
}

function show(value: unknown): string {
  return typeof value === 'string' ? value : JSON.stringify(value)
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v)

/**
 * A strict object of form fields: unknown keys are refused, and a blank value counts as not given, because the
 * SDK sends `null` as `key=` (observed SDK behaviour). Mark fields that may be left out with `.optional()`.
 */
export function form<S extends z.core.$ZodLooseShape>(shape: S) {
  return z.preprocess(
    (v) => (isRecord(v) ? Object.fromEntries(Object.entries(v).filter(([, x]) => x !== '')) : v),
    z.strictObject(shape),
  )
}

/** A whole number sent as a string; anything else (or beyond a safe integer) is an invalid integer. */
export function integer(min?: number, max?: number) {
  let n = z.number().int()
  if (min !== undefined) n = n.min(min)
  if (max !== undefined) n = n.max(max)
  return z.preprocess((v) => (typeof v === 'string' && /^-?\d+$/.test(v) && Number.isSafeInteger(Number(v)) ? Number(v) : v), n)
}

export const boolean = z.preprocess((v) => (v === 'true' ? true : v === 'false' ? false : v), z.boolean())

/**
 * Metadata: a blank value removes the key (becomes null). Numeric keys come back from the decoder as an array,
 * so they are turned back into keys. Limits (API reference, from memory): 50 keys, keys up to 40 characters,
 * values up to 500.
 */
export const metadata = z.preprocess(
  (v) => (Array.isArray(v) ? { ...v } : v),
  z.record(z.string(), z.unknown()).transform((m, ctx) => {
    const entries = Object.entries(m)
    if (entries.length > 50) ctx.addIssue({ code: 'custom', message: 'Invalid metadata: at most 50 keys', input: m })
    const out: Record<string, string | null> = {}
    for (const [k, v] of entries) {
      const problem = typeof v !== 'string' ? `Invalid metadata value for ${k}: must be a string`
        : k.length > 40 ? `Invalid metadata key ${k}: at most 40 characters`
          : v.length > 500 ? `Invalid metadata value for ${k}: at most 500 characters`
            : null
      if (problem) ctx.addIssue({ code: 'custom', message: problem, path: [k], input: v })
      else out[k] = v === '' ? null : (v as string)
    }
    return out
  }),
)

/** A created-at filter: one timestamp, or bounds (where a blank bound is an invalid integer, not a missing one). */
export const range = z.union([
  integer(),
  z.strictObject({ gt: integer().optional(), gte: integer().optional(), lt: integer().optional(), lte: integer().optional() }),
], 'Invalid range')

export type Range = z.output<typeof range>

/** `expand[]`: dotted paths of id fields to replace by their objects. */
export const expandField = z.array(z.string())

/** The cursor fields every list endpoint takes. */
export const pagingFields = {
  limit: integer(1, 100).optional(),
  starting_after: z.string().optional(),
  ending_before: z.string().optional(),
  expand: expandField.optional(),
}

/** The fields of the lists of stored objects: paging and the created-at filter. */
export const listFields = { ...pagingFields, created: range.optional() }

export const expandOnly = form({ expand: expandField.optional() })

const typeMessages: Record<string, (input: unknown) => string> = {
  string: (v) => `Invalid string: ${show(v)}`,
  number: (v) => `Invalid integer: ${show(v)}`, // API reference (from memory): "Invalid integer: abc"
  boolean: (v) => `Invalid boolean: ${show(v)}`,
  array: () => 'Invalid array',
  object: () => 'Invalid object',
  record: () => 'Invalid object',
}

/** One zod issue in the API's words; `at` is the path of an enclosing union. */
function errorFor(issue: z.core.$ZodIssue, at: Path = []): ApiError {
  const path = [...at, ...issue.path]
  const param = paramName(path)
  switch (issue.code) {
    case 'unrecognized_keys': {
      // API reference (from memory): "Received unknown parameter: <name>"
      const name = paramName([...path, issue.keys[0] as string])
      return paramError(`Received unknown parameter: ${name}`, name, 'parameter_unknown')
    }
    case 'invalid_type':
      if (issue.input === undefined) return missing(param)
      return paramError((typeMessages[issue.expected] ?? (() => `Invalid ${param}`))(issue.input), param)
    case 'too_big':
      if (issue.origin === 'array') return paramError(`Invalid ${param}: at most ${issue.maximum} entries`, param)
      return paramError(`Invalid ${param}: must be at most ${issue.maximum}${issue.origin === 'string' ? ' characters' : ''}`, param)
    case 'too_small':
      return paramError(issue.minimum === 1 ? 'Invalid positive integer' : `Invalid ${param}: must be at least ${issue.minimum}`, param)
    case 'invalid_value':
      return paramError(`Invalid ${param}: must be one of ${issue.values.map(String).join(', ')}`, param)
    case 'invalid_union': {
      // The branch that got past the value's type says what is wrong; a string is read as the first branch
      // (a timestamp); any other value fits no branch, which the union's own message says.
      const branch = issue.errors.flat().find((i) => i.path.length > 0) ?? (typeof issue.input === 'string' ? issue.errors[0]?.[0] : undefined)
      return branch ? errorFor(branch, path) : paramError(issue.message, param)
    }
    case 'custom':
      return paramError(issue.message, param)
  }
  return paramError(`Invalid ${param}`, param)
}

/** Checks decoded parameters against a schema; the first problem becomes a 400 the SDK raises. */
export function parse<T extends z.ZodType>(schema: T, params: FormObject): z.output<T> {
  const result = schema.safeParse(params, { reportInput: true })
  if (result.success) return result.data
  const { issues } = result.error
  // Unknown parameters are reported before anything else about the request.
  throw errorFor(issues.find((i) => i.code === 'unrecognized_keys') ?? (issues[0] as z.core.$ZodIssue))
}

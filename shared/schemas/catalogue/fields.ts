/**
 * Field builders for the catalogue's inputs: each message names the quantity and, for lengths, the unit, so the
 * form can show it beside the field as it is. Body fields are typed JSON; query fields arrive as text, and an
 * empty one (`?diameterMin=`) counts as absent.
 */
import { z } from 'zod'

export function mm(label: string, min: number, max: number) {
  return z.number({ error: (i) => (i.input === undefined ? `${label} is required` : `${label} must be a number (mm)`) })
    .min(min, { error: `${label} must be at least ${min} mm` })
    .max(max, { error: `${label} must be at most ${max} mm (check the unit)` })
}

export function int(label: string, min: number, max: number) {
  return z.number({ error: (i) => (i.input === undefined ? `${label} is required` : `${label} must be a whole number`) })
    .int({ error: `${label} must be a whole number` })
    .min(min, { error: `${label} must be at least ${min}` })
    .max(max, { error: `${label} must be at most ${max}` })
}

export function bool(label: string) {
  return z.boolean({ error: `${label} must be yes or no` })
}

export function oneOf<const T extends readonly [string, ...string[]]>(label: string, values: T) {
  return z.enum(values, { error: `${label} must be ${values.join(', ')}` })
}

export function text(label: string, max: number) {
  return z.string({ error: `${label} is required` }).trim().min(1, { error: `${label} is required` }).max(max, { error: `${label} is at most ${max} characters` })
}

/** Free text that may be left empty, e.g. a note. */
export function note(label: string, max: number) {
  return z.string().trim().max(max, { error: `${label} is at most ${max} characters` })
}

const emptyToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v)

/** An optional query parameter read by `schema` once an empty value is taken as absent. */
export const optionalQuery = <T extends z.ZodType>(schema: T) => z.preprocess(emptyToUndefined, schema.optional())

export const queryNumber = (label: string, min: number, max: number) => optionalQuery(
  z.coerce.number({ error: `${label} must be a number` }).refine(Number.isFinite, { error: `${label} must be a number` })
    .min(min, { error: `${label} must be at least ${min}` }).max(max, { error: `${label} must be at most ${max}` }))

export const queryInt = (label: string, min: number, max: number) => optionalQuery(
  z.coerce.number({ error: `${label} must be a whole number` }).int({ error: `${label} must be a whole number` })
    .min(min, { error: `${label} must be at least ${min}` }).max(max, { error: `${label} must be at most ${max}` }))

export const queryText = (label: string, max: number) => optionalQuery(
  z.string({ error: `${label} must be text` }).trim().max(max, { error: `${label} is at most ${max} characters` }))

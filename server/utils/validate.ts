/**
 * Input validation with one error shape: 422 `{ data: { fields: { "path.to.field": "message" } } }` (see
 * server/utils/errors.ts). Every route validates its params, query and body with a schema from shared/ before
 * using them; JSON bodies are read by `readJsonBody` alone.
 */
import type { H3Event } from 'h3'
import { getQuery, getRouterParams, readBody } from 'h3'
import type { ZodType } from 'zod'
import type { ParseResult } from '../../shared/utils/brake/schemas'
import { fieldMessages } from '../../shared/utils/field-messages'
import { invalidInput } from '../services/errors'

/** The parsed value, or 422 naming every field at fault. */
export function parseWith<T>(schema: ZodType<T>, value: unknown): T {
  const r = schema.safeParse(value)
  if (!r.success) throw invalidInput(fieldMessages(r.error.issues))
  return r.data
}

/** The request's JSON body (an empty body reads as `{}`); 422 when it is not JSON. */
export async function readJsonBody(event: H3Event): Promise<unknown> {
  try {
    return (await readBody(event)) ?? {}
  } catch {
    throw invalidInput({ _: 'The request body is not valid JSON.' })
  }
}

export async function bodyWith<T>(event: H3Event, schema: ZodType<T>): Promise<T> {
  return parseWith(schema, await readJsonBody(event))
}

export function queryWith<T>(event: H3Event, schema: ZodType<T>): T {
  return parseWith(schema, getQuery(event))
}

export function paramsWith<T>(event: H3Event, schema: ZodType<T>): T {
  return parseWith(schema, getRouterParams(event, { decode: true }))
}

/**
 * A body parsed by the brake library's own parser (shared/utils/brake): 422 naming each impossible field, so
 * nothing is computed from half an input.
 */
export async function bodyParsedBy<T>(event: H3Event, parse: (body: unknown) => ParseResult<T>): Promise<T> {
  const parsed = parse(await readJsonBody(event))
  if (!parsed.ok) throw invalidInput(fieldMessages(parsed.issues))
  return parsed.data
}

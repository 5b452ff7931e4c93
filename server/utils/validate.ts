/**
 * Input validation with one error shape: 422 `{ data: { fields: { "path.to.field": "message" } } }`.
 * Every route validates its params, query and body with a zod schema from shared/ before using them.
 */
import type { H3Event } from 'h3'
import { createError, getQuery, getRouterParams, readBody } from 'h3'
import type { ZodType } from 'zod'

export function fieldErrors(issues: { path: PropertyKey[]; message: string; code?: string; keys?: string[] }[]): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const i of issues) {
    // a strict schema names every field it refuses (mass assignment), each under its own key
    if (i.code === 'unrecognized_keys' && i.keys?.length) {
      for (const k of i.keys) fields[[...i.path.map(String), k].join('.')] ??= 'This field cannot be set here.'
      continue
    }
    const key = i.path.map(String).join('.') || '_'
    fields[key] ??= i.message
  }
  return fields
}

/** A 422 naming the fields at fault. */
export function invalidInput(fields: Record<string, string>, message = 'Some fields need attention.') {
  const named = Object.keys(fields).filter((k) => k !== '_')
  return createError({
    statusCode: 422,
    statusMessage: 'Unprocessable Entity',
    message: named.length ? `${message} (${named.join(', ')})` : (fields._ ?? message),
    data: { fields },
  })
}

export function parseWith<T>(schema: ZodType<T>, value: unknown): T {
  const r = schema.safeParse(value)
  if (!r.success) throw invalidInput(fieldErrors(r.error.issues))
  return r.data
}

export async function bodyWith<T>(event: H3Event, schema: ZodType<T>): Promise<T> {
  let body: unknown
  try {
    body = await readBody(event)
  } catch {
    throw invalidInput({ _: 'The request body is not valid JSON.' })
  }
  return parseWith(schema, body ?? {})
}

export function queryWith<T>(event: H3Event, schema: ZodType<T>): T {
  return parseWith(schema, getQuery(event))
}

export function paramsWith<T>(event: H3Event, schema: ZodType<T>): T {
  return parseWith(schema, getRouterParams(event, { decode: true }))
}

/** 404 with a message, for records that do not exist or are not the caller's (never reveal which). */
export function notFound(what = 'Record'): Error {
  return createError({ statusCode: 404, statusMessage: 'Not Found', message: `${what} not found.` })
}

export function conflict(message: string): Error {
  return createError({ statusCode: 409, statusMessage: 'Conflict', message })
}

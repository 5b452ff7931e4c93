/**
 * Server-side glue for the brake calculations (shared/utils/brake): turning the library's field issues into
 * the project's 422 shape. Plain Node, no Nitro auto-imports.
 */
import type { H3Event } from 'h3'
import { readBody } from 'h3'
import type { FieldIssue, ParseResult } from '../../shared/utils/brake/schemas'
import { invalidInput } from '../utils/validate'

/**
 * The library's issues as `data.fields` for a 422: `{ "axles.front.frictionCoefficient": "message" }`.
 * The first message per field wins; a problem with the whole body is keyed `_` (the project's convention).
 * @param prefix prepended to each path when the brake input sits inside a larger body, e.g. `wear`
 */
export function issuesToFields(issues: readonly FieldIssue[], prefix = ''): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const issue of issues) {
    const own = issue.field === '(body)' ? '' : issue.field
    const key = prefix ? (own ? `${prefix}${own.startsWith('[') ? '' : '.'}${own}` : prefix) : own || '_'
    fields[key] ??= issue.message
  }
  return fields
}

/**
 * The body of a calculation route, read and parsed by the library's own parser: 422 with `data.fields` for a body
 * that is not JSON or for any impossible field (nothing is computed from half an input).
 */
export async function calculationBody<T>(event: H3Event, parse: (body: unknown) => ParseResult<T>): Promise<T> {
  let body: unknown
  try {
    body = await readBody(event)
  } catch {
    throw invalidInput({ _: 'The request body is not valid JSON.' })
  }
  const parsed = parse(body)
  if (!parsed.ok) throw invalidInput(issuesToFields(parsed.issues))
  return parsed.data
}

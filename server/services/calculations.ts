/**
 * Server-side glue for the brake calculations (shared/utils/brake): turning the library's field issues into
 * the project's 422 shape. Plain Node, no Nitro auto-imports.
 */
import type { FieldIssue } from '../../shared/utils/brake/schemas'

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

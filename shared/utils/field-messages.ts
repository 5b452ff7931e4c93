/** A validation issue as zod reports it, or as the brake library reports it (a dotted `field`). */
export type ValidationIssue =
  | { path: readonly PropertyKey[]; message: string; code?: string; keys?: readonly string[] }
  | { field: string; message: string }

/**
 * Validation issues -> one message per field path, the first one winning; a problem with the whole input is keyed
 * `_`. A strict schema's refusal of unknown keys names each key ("This field cannot be set here."): that is how
 * mass assignment is answered. `prefix` files the issues of a nested input under its field (`wear.discs[0].x`).
 * The server answers 422 with these as `data.fields`; forms show them next to their inputs.
 */
export function fieldMessages(issues: readonly ValidationIssue[], prefix = ''): Record<string, string> {
  const fields: Record<string, string> = {}
  const put = (own: string, message: string) => {
    const key = prefix ? (own ? `${prefix}${own.startsWith('[') ? '' : '.'}${own}` : prefix) : own || '_'
    fields[key] ??= message
  }
  for (const issue of issues) {
    if ('field' in issue) {
      put(issue.field === '(body)' ? '' : issue.field, issue.message)
      continue
    }
    const path = issue.path.map(String).join('.')
    if (issue.code === 'unrecognized_keys' && issue.keys?.length) {
      for (const k of issue.keys) put(path ? `${path}.${k}` : k, 'This field cannot be set here.')
      continue
    }
    put(path, issue.message)
  }
  return fields
}

/** What the audit log records of a change: only the fields whose value moves. */
export type FieldChanges = Record<string, { from: unknown; to: unknown }>

/** `{ field: { from, to } }` for each field of `after` that is given and differs from `before`. */
export function changedFields(before: Record<string, unknown>, after: Record<string, unknown>): FieldChanges {
  const out: FieldChanges = {}
  for (const k of Object.keys(after)) {
    if (after[k] !== undefined && before[k] !== after[k]) out[k] = { from: before[k] ?? null, to: after[k] }
  }
  return out
}

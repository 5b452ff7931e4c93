/**
 * Form bodies and query strings as the SDK sends them: `line_items[0][price_data][unit_amount]=1250`, brackets
 * unencoded, indexes always present, every value a string (observed SDK behaviour). `qs` is not installed here,
 * so URLSearchParams splits the pairs and a small reader follows each key's bracket path.
 */
import { paramError } from './errors'

/** Decoded values stay strings; the endpoint schemas coerce numbers and booleans where a field wants them. */
export type FormValue = string | FormObject | FormValue[]
export interface FormObject { [key: string]: FormValue }

// Keys that would reach Object.prototype through the nested objects built below.
const FORBIDDEN_SEGMENTS = new Set(['__proto__', 'prototype', 'constructor'])

/** `a[b][0]` -> ['a', 'b', '0']; null when the key is not a name followed by bracket groups. */
function bracketPath(key: string): string[] | null {
  const m = /^([^[]*)((?:\[[^\]]*\])*)$/.exec(key)
  if (!m || (m[1] === '' && m[2] !== '')) return null
  const path = [m[1] as string, ...[...(m[2] as string).matchAll(/\[([^\]]*)\]/g)].map((g) => g[1] as string)]
  return path.some((s) => FORBIDDEN_SEGMENTS.has(s)) ? null : path
}

/** Objects whose keys are all indexes become arrays, in index order. */
function withArrays(value: FormValue): FormValue {
  if (typeof value === 'string') return value
  if (Array.isArray(value)) return value.map(withArrays)
  const keys = Object.keys(value)
  if (keys.length > 0 && keys.every((k) => /^\d+$/.test(k))) {
    return keys.sort((a, b) => Number(a) - Number(b)).map((k) => withArrays(value[k] as FormValue))
  }
  return Object.fromEntries(keys.map((k) => [k, withArrays(value[k] as FormValue)]))
}

/**
 * Decodes an `application/x-www-form-urlencoded` string into nested objects and arrays. Numeric-looking ids and
 * metadata values stay strings, as only the schema knows which fields are numbers.
 */
export function decodeForm(input: string): FormObject {
  const root: FormObject = {}
  for (const [key, value] of new URLSearchParams(input)) {
    const path = bracketPath(key)
    if (!path) throw paramError(`Invalid parameter name: ${key}`, key)
    let cur = root
    path.forEach((segment, i) => {
      const name = segment === '' ? String(Object.keys(cur).length) : segment // `a[]=x` appends
      const existing = cur[name]
      const last = i === path.length - 1
      if (existing !== undefined && (typeof existing === 'string') === !last) {
        throw paramError(`Invalid parameter: ${key} is given both as a value and as a hash`, key)
      }
      if (last) cur[name] = value
      else cur = (cur[name] ??= {}) as FormObject
    })
  }
  // The top level stays an object even when every key is an index, so such keys are reported as unknown.
  return Object.fromEntries(Object.entries(root).map(([k, v]) => [k, withArrays(v)]))
}

/** For the request log: the decoded form when it decodes, the raw text when it does not. */
export function decodedOrRaw(raw: string): unknown {
  try {
    return decodeForm(raw)
  } catch {
    return raw
  }
}

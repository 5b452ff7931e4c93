/**
 * What every endpoint does to its answer: `expand[]` (ids replaced by the objects they name) and the list
 * envelope with cursor paging (`limit`, `starting_after`, `ending_before`) and the `created` filter.
 */
import { noSuch, paramError } from './errors'
import type { Range } from './params'
import { clone, objectById, type FakeState } from './store'

const EXPANDABLE: Record<string, string[]> = {
  'checkout.session': ['payment_intent', 'line_items'],
  payment_intent: ['latest_charge'],
  charge: ['payment_intent'],
  refund: ['charge', 'payment_intent'],
}

function cannotExpand(what: string): never {
  // API reference (from memory)
  throw paramError(`This property cannot be expanded (${what}).`, 'expand')
}

function expandPath(state: FakeState, target: Record<string, unknown>, segments: string[], full: string): void {
  const [field, ...rest] = segments as [string, ...string[]]
  const kind = String(target.object ?? '')
  if (!(EXPANDABLE[kind] ?? []).includes(field)) cannotExpand(field)
  if (kind === 'checkout.session' && field === 'line_items') {
    const items = state.lineItems.get(String(target.id)) ?? []
    target.line_items = { object: 'list', data: clone(items), has_more: false, url: `/v1/checkout/sessions/${String(target.id)}/line_items` }
    if (rest.length > 0) cannotExpand(full)
    return
  }
  let value = target[field]
  if (typeof value === 'string') {
    const found = objectById(state, value)
    if (found) {
      value = clone(found)
      target[field] = value
    }
  }
  if (rest.length > 0 && value && typeof value === 'object') expandPath(state, value as Record<string, unknown>, rest, full)
}

/** A copy of the object with the named id fields replaced by their objects (dotted paths go deeper). */
export function expand<T extends object>(state: FakeState, obj: T, paths: string[] | undefined): T {
  const out = clone(obj) as Record<string, unknown>
  for (const path of paths ?? []) {
    if (path.length > 0) expandPath(state, out, path.split('.'), path)
  }
  return out as T
}

export interface ListParams {
  limit?: number
  starting_after?: string
  ending_before?: string
  created?: Range
  expand?: string[]
}

export interface List<T> {
  object: 'list'
  data: T[]
  has_more: boolean
  url: string
}

function inRange(created: number, range: Range): boolean {
  if (typeof range === 'number') return created === range
  return (range.gt === undefined || created > range.gt) && (range.gte === undefined || created >= range.gte) &&
    (range.lt === undefined || created < range.lt) && (range.lte === undefined || created <= range.lte)
}

/** One page of `items` (already in the order the endpoint lists them). */
export function list<T extends { id: string; created?: number }>(state: FakeState, items: T[], params: ListParams, url: string): List<T> {
  const { created } = params
  const rows = created === undefined ? items : items.filter((r) => inRange(r.created ?? 0, created))
  const limit = params.limit ?? 10
  let start = 0
  let end = rows.length
  if (params.starting_after) {
    const i = rows.findIndex((r) => r.id === params.starting_after)
    if (i === -1) throw noSuch('object', params.starting_after, 'starting_after')
    start = i + 1
  } else if (params.ending_before) {
    const i = rows.findIndex((r) => r.id === params.ending_before)
    if (i === -1) throw noSuch('object', params.ending_before, 'ending_before')
    end = i
    start = Math.max(0, end - limit)
  }
  const page = rows.slice(start, Math.min(end, start + limit))
  const itemExpands = (params.expand ?? []).filter((p) => p.startsWith('data.')).map((p) => p.slice(5))
  const otherExpand = (params.expand ?? []).find((p) => !p.startsWith('data.'))
  if (otherExpand) cannotExpand(otherExpand)
  return {
    object: 'list',
    data: page.map((r) => expand(state, r, itemExpands)),
    has_more: params.ending_before ? start > 0 : start + limit < end,
    url,
  }
}

/** Lists show the newest first; objects made in the same second keep their reverse order of making. */
export function newestFirst<T extends { created: number }>(rows: Iterable<T>): T[] {
  return [...rows].map((r, i) => ({ r, i })).sort((a, b) => b.r.created - a.r.created || b.i - a.i).map((x) => x.r)
}

/**
 * GET /api/parts: the page query of every list (shared/schemas/page.ts) extended with the part filters: words or
 * identifiers (`q`), type, axle and ranges on the dimensions specs carry (`<dim>Mm` exact, `<dim>Min`, `<dim>Max`).
 */
import type { z } from 'zod'
import { PageQuerySchema } from '../page'
import type { AxleName } from '../../types/axles'
import { optionalQuery, queryNumber, queryText } from './fields'
import { AxleSchema, PartTypeSchema, type PartType } from './part-types'

/** Spec dimensions the part list can filter on; each takes `<dim>Mm` (exact), `<dim>Min` and `<dim>Max`. */
export const DIMENSIONS = ['diameter', 'bore', 'piston', 'thickness', 'width', 'length'] as const
export type Dimension = (typeof DIMENSIONS)[number]
export type DimensionRange = { min?: number; max?: number }

/** Exact `<dim>Mm` filters match within this (the catalogue states 22.22 for a 7/8 in bore of 22.225 mm). */
export const EXACT_DIMENSION_TOLERANCE_MM = 0.01

/** How each filter is named in its messages, as the search form labels it (never the parameter's name). */
const cap = (d: string) => `${d[0]!.toUpperCase()}${d.slice(1)}`
const FILTER_WORDS = { Mm: (d: string) => `${cap(d)} (mm)`, Min: (d: string) => `${cap(d)} from (mm)`, Max: (d: string) => `${cap(d)} to (mm)` }
const dimensionFilters: Record<string, z.ZodType> = {}
for (const d of DIMENSIONS) {
  for (const suffix of ['Mm', 'Min', 'Max'] as const) dimensionFilters[`${d}${suffix}`] = queryNumber(FILTER_WORDS[suffix](d), 0, 2000)
}

export const PartListQuerySchema = PageQuerySchema.extend({
  q: queryText('Search', 200),
  type: optionalQuery(PartTypeSchema),
  axle: optionalQuery(AxleSchema),
  ...dimensionFilters,
}).superRefine((q, ctx) => {
  const v = q as unknown as Record<string, number | undefined>
  for (const d of DIMENSIONS) {
    const lo = v[`${d}Min`], hi = v[`${d}Max`]
    if (lo !== undefined && hi !== undefined && lo > hi) ctx.addIssue({ code: 'custom', path: [`${d}Max`], message: `${cap(d)} to must not be less than ${d} from` })
  }
})

/** The part list query as the search reads it: the dimension filters become ranges. */
export interface PartListQuery {
  q?: string
  type?: PartType
  axle?: AxleName
  page: number
  pageSize: number
  ranges: Partial<Record<Dimension, DimensionRange>>
}

/** A validated {@link PartListQuerySchema} query as {@link PartListQuery}. */
export function partListQueryOf(parsed: z.infer<typeof PartListQuerySchema>): PartListQuery {
  const q = parsed as Record<string, unknown> & { page: number; pageSize: number }
  const ranges: PartListQuery['ranges'] = {}
  for (const d of DIMENSIONS) {
    const exact = q[`${d}Mm`] as number | undefined
    const lo = q[`${d}Min`] as number | undefined
    const hi = q[`${d}Max`] as number | undefined
    if (exact !== undefined) ranges[d] = { min: exact - EXACT_DIMENSION_TOLERANCE_MM, max: exact + EXACT_DIMENSION_TOLERANCE_MM }
    else if (lo !== undefined || hi !== undefined) ranges[d] = { min: lo, max: hi }
  }
  return {
    q: q.q as string | undefined, type: q.type as PartType | undefined, axle: q.axle as AxleName | undefined,
    page: q.page, pageSize: q.pageSize, ranges,
  }
}

/** Validates a raw query into {@link PartListQuery}; throws a ZodError naming the field. */
export function parsePartListQuery(raw: Record<string, unknown>): PartListQuery {
  return partListQueryOf(PartListQuerySchema.parse(raw))
}

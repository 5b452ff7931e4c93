/**
 * The one list contract: every list route reads `page` and `pageSize` with this schema (extend it with the list's
 * own filters) and answers a `Page<T>` (shared/types/page.ts), built on the server by `pageOf`
 * (server/utils/page.ts). Nothing stops silently at a hidden limit: a longer list has more pages.
 */
import { z } from 'zod'

export const PAGE_SIZE_DEFAULT = 20
export const PAGE_SIZE_MAX = 100
const PAGE_MAX = 100_000

/** Empty query values (`?page=`) count as absent. */
const emptyToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v)

export const PageQuerySchema = z.object({
  page: z.preprocess(emptyToUndefined, z.coerce.number({ error: 'Page must be a whole number.' })
    .int({ error: 'Page must be a whole number.' }).min(1, { error: 'Pages start at 1.' }).max(PAGE_MAX, { error: 'That page is too far.' })
    .default(1)),
  pageSize: z.preprocess(emptyToUndefined, z.coerce.number({ error: 'Page size must be a whole number.' })
    .int({ error: 'Page size must be a whole number.' }).min(1, { error: 'At least 1 per page.' }).max(PAGE_SIZE_MAX, { error: `At most ${PAGE_SIZE_MAX} per page.` })
    .default(PAGE_SIZE_DEFAULT)),
})
export type PageQuery = z.infer<typeof PageQuerySchema>

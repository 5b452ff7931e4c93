/** The server half of the list contract (shared/schemas/page.ts): limit/offset in, `Page<T>` out. */
import type { PageQuery } from '../../shared/schemas/page'
import type { Page, PageInfo } from '../../shared/types/page'

/** `LIMIT`/`OFFSET` for a page query (Sequelize's `limit`/`offset` options). */
export function pageWindow(query: PageQuery): { limit: number; offset: number } {
  return { limit: query.pageSize, offset: (query.page - 1) * query.pageSize }
}

export function pageMeta(query: PageQuery, total: number): PageInfo {
  return { page: query.page, pageSize: query.pageSize, total, pages: Math.max(1, Math.ceil(total / query.pageSize)) }
}

/**
 * One page: `load` gets the window and returns the rows with the total count (`findAndCountAll` does both);
 * `view` shapes each row for the answer.
 */
export async function pageOf<R, T>(
  query: PageQuery,
  load: (window: { limit: number; offset: number }) => Promise<{ rows: R[]; count: number }>,
  view: (rows: R[]) => T[] | Promise<T[]>,
): Promise<Page<T>> {
  const { rows, count } = await load(pageWindow(query))
  return { data: await view(rows), meta: pageMeta(query, count) }
}

/** A page cut from a list already in memory (a list the server builds whole, such as computed findings). */
export function pageOfList<T>(query: PageQuery, all: readonly T[]): Page<T> {
  const { limit, offset } = pageWindow(query)
  return { data: all.slice(offset, offset + limit), meta: pageMeta(query, all.length) }
}

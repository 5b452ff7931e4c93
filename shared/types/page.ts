/** One page of a list, as every list route answers (see shared/schemas/page.ts). */
export interface Page<T> {
  data: T[]
  meta: PageInfo
}

export interface PageInfo {
  page: number
  pageSize: number
  total: number
  /** at least 1, so "page 1 of 1" reads right for an empty list */
  pages: number
}

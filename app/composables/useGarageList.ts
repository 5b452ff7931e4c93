import { refDebounced } from '@vueuse/core'
import type { TradeAccountSummary, PageOf } from '#shared/types/trade-accounts'

/**
 * A server-side filtered, sorted, paged garage list (`/api/admin/trade-applications` or `/api/admin/trade-accounts`).
 * The search is debounced; any filter change goes back to page 1.
 */
export function useGarageList(url: string, defaults: { status: string; sort: string }) {
  const status = ref(defaults.status)
  const q = ref('')
  const sort = ref(defaults.sort)
  const page = ref(1)
  const search = refDebounced(q, 300)
  watch([status, search, sort], () => { page.value = 1 })
  const query = computed(() => ({ status: status.value, sort: sort.value, page: page.value, pageSize: 20, ...(search.value.trim() ? { q: search.value.trim() } : {}) }))
  const { data, error, pending, refresh } = useFetch<PageOf<TradeAccountSummary>>(url, { key: `garages:${url}`, query })
  // (useFetch has a `status` of its own: only the pieces the pages use are passed on)
  return { status, q, sort, page, data, error, pending, refresh }
}

import { refDebounced } from '@vueuse/core'
import type { Page } from '#shared/types/page'
import type { TradeAccountSummary } from '#shared/types/trade-accounts'

/**
 * A garage list filtered, sorted and paged on the server (`/api/admin/trade-applications` or
 * `/api/admin/trade-accounts`). The search is debounced; any filter change goes back to page 1.
 */
export function useGarageList(url: string, defaults: { status: string; sort: string }) {
  const status = ref(defaults.status)
  const q = ref('')
  const sort = ref(defaults.sort)
  const page = ref(1)
  const search = refDebounced(q, 300)
  watch([status, search, sort], () => { page.value = 1 })
  const query = computed(() => ({ status: status.value, sort: sort.value, page: page.value, ...(search.value.trim() ? { q: search.value.trim() } : {}) }))
  const { data, error, pending, refresh } = useFetch<Page<TradeAccountSummary>>(url, { key: `garages:${url}`, query })
  // (useFetch has a `status` of its own: only the pieces the list uses are passed on)
  return { status, q, sort, page, data, error, pending, refresh }
}

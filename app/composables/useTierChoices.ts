import { PAGE_SIZE_MAX } from '#shared/schemas/page'
import type { Page } from '#shared/types/page'
import type { TierView } from '#shared/types/trade-accounts'

/**
 * The discount tiers to choose from (approving an application, changing terms). A distributor keeps a handful, so
 * the list's largest page holds them all; `meta.total` says when it does not.
 */
export function useTierChoices(options: { immediate?: boolean } = {}) {
  return useFetch<Page<TierView>>('/api/admin/tiers', { key: 'tier-choices', query: { pageSize: PAGE_SIZE_MAX }, immediate: options.immediate ?? true })
}

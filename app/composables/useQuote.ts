import type { QuoteDetail } from '#shared/types/quotes'

/** One quote of the caller's garage, keyed `quote:<id>` (SSR forwards the cookie through useFetch). */
export function useQuote(id: MaybeRefOrGetter<string | number>) {
  return useFetch<QuoteDetail>(() => `/api/quotes/${toValue(id)}`, { key: computed(() => `quote:${toValue(id)}`) })
}

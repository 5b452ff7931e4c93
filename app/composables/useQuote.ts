import type { QuoteDetail } from '#shared/types/quotes'

/** The key under which one quote's server answer is kept (useNuxtData reads and writes it). */
export const quoteKey = (id: string | number) => `quote:${id}`

/**
 * One quote of the caller's garage, keyed `quote:<id>` (SSR forwards the cookie through useFetch). This is the
 * one client copy of the server's quote: a change's answer is written back here.
 */
export function useQuote(id: MaybeRefOrGetter<string | number>) {
  return useFetch<QuoteDetail>(() => `/api/quotes/${toValue(id)}`, { key: computed(() => quoteKey(toValue(id))) })
}

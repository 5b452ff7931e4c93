/**
 * The quote being edited: the server's latest answer and the state of the change in flight. Every change goes
 * to the server, which prices it and answers the whole quote; when the quote had left draft the answer is a new
 * revision, and the editor moves to its address.
 */
import { defineStore } from 'pinia'
import type { QuoteDetail } from '#shared/types/quotes'

type FetchError = { statusCode?: number; data?: { message?: string; data?: { fields?: Record<string, string> } } }

export const useQuoteDraftStore = defineStore('quoteDraft', () => {
  const quote = ref<QuoteDetail | null>(null)
  const busy = ref('')
  const fields = ref<Record<string, string>>({})
  const problem = ref('')
  const notice = ref('')

  function load(q: QuoteDetail | null | undefined) {
    if (q) quote.value = q
  }

  function clearFeedback() {
    fields.value = {}
    problem.value = ''
  }

  /**
   * Sends one change (`what` names it for the busy state). Returns the answer, or null when it failed (the
   * server's field messages are in `fields`, its message in `problem`).
   */
  async function change<T extends QuoteDetail>(what: string, request: () => Promise<T>): Promise<T | null> {
    const before = quote.value
    busy.value = what
    clearFeedback()
    notice.value = ''
    try {
      const answer = await request()
      quote.value = answer
      if (before && answer.id !== before.id) {
        notice.value = `This quote had been sent, so the change was made in a new revision (revision ${answer.revision}); revision ${before.revision} is kept as it was.`
        await navigateTo(`/quotes/${answer.id}`, { replace: true })
      }
      return answer
    } catch (err) {
      const e = err as FetchError
      fields.value = e.data?.data?.fields ?? {}
      problem.value = e.data?.message ?? 'The change could not be saved. Please try again.'
      return null
    } finally {
      busy.value = ''
    }
  }

  return { quote, busy, fields, problem, notice, load, clearFeedback, change }
})

/**
 * The quote editor's own state: which change is in flight, the server's field messages and summary for it, and
 * the note shown after a change made a new revision. The quote itself is the server's and lives in the keyed
 * fetch (`useQuote`): every change goes to the server, which prices it and answers the whole quote; the answer
 * is written back there, or, when the quote had left draft and the answer is a new revision, the editor moves
 * to its address.
 */
import { defineStore } from 'pinia'
import type { QuoteDetail } from '#shared/types/quotes'

type FetchError = { statusCode?: number; data?: { message?: string; data?: { fields?: Record<string, string> } } }

export const useQuoteDraftStore = defineStore('quoteDraft', () => {
  const busy = ref('')
  const fields = ref<Record<string, string>>({})
  const problem = ref('')
  /** said on the revision a change made, once the editor shows it */
  const notice = ref<{ quoteId: number; text: string } | null>(null)

  function clearFeedback() {
    fields.value = {}
    problem.value = ''
  }

  /**
   * Sends one change to `from` (`what` names it for the busy state). Returns the answer, or null when it failed
   * (the server's field messages are in `fields`, its message in `problem`).
   */
  async function change<T extends QuoteDetail>(what: string, from: QuoteDetail, request: () => Promise<T>): Promise<T | null> {
    busy.value = what
    clearFeedback()
    notice.value = null
    try {
      const answer = await request()
      if (answer.id === from.id) {
        useNuxtData<QuoteDetail>(quoteKey(answer.id)).data.value = answer
      } else {
        notice.value = { quoteId: answer.id, text: `This quote had been sent, so the change was made in a new revision (revision ${answer.revision}); revision ${from.revision} is kept as it was.` }
        await navigateTo(`/quotes/${answer.id}`, { replace: true })
      }
      return answer
    } catch (err) {
      const e = err as FetchError
      fields.value = e.data?.data?.fields ?? {}
      // the server's summary names its fields for API callers; people get the messages beside the fields instead
      const named = Object.keys(fields.value).filter((k) => k !== '_')
      problem.value = fields.value._ ?? (named.length ? 'Please check the fields marked below.' : (e.data?.message ?? 'The change could not be saved. Please try again.'))
      return null
    } finally {
      busy.value = ''
    }
  }

  return { busy, fields, problem, notice, clearFeedback, change }
})

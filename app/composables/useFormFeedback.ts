/**
 * Field messages for a form: from the shared zod schema before sending, and from the server's 422/413/415
 * answer (`data.fields`) after. Pages show `fields[name]` next to each input and `problem` above the button.
 */
import { fieldMessages, type ValidationIssue } from '#shared/utils/field-messages'

export function useFormFeedback() {
  const fields = ref<Record<string, string>>({})
  const problem = ref('')
  const busy = ref(false)
  /** false until the page is hydrated: disable submit buttons with it, so an early click or Enter cannot
   *  fall back to a native GET submit that would put the fields (passwords) in the URL */
  const ready = ref(false)
  onMounted(() => { ready.value = true })

  function reset() {
    fields.value = {}
    problem.value = ''
  }

  /** Validation issues -> one message per field (the first, as the server answers). Returns false. */
  function fromIssues(issues: readonly ValidationIssue[]): false {
    fields.value = fieldMessages(issues)
    problem.value = 'Please check the fields marked below.'
    return false
  }

  /** An ofetch error from one of our routes -> field messages and a summary line. */
  function fromError(err: unknown, fallback = 'Something went wrong. Please try again.') {
    const e = err as { data?: { message?: string; data?: { fields?: Record<string, string> } }; statusCode?: number }
    const f = { ...(e.data?.data?.fields ?? {}) }
    fields.value = f
    const named = Object.keys(f).filter((k) => k !== '_')
    problem.value = f._ ?? (named.length ? 'Please check the fields marked below.' : (e.data?.message ?? fallback))
  }

  /** Runs `fn` with `busy` set; failures land in `fields`/`problem`. Returns whether it succeeded. */
  async function run(fn: () => Promise<unknown>, fallback?: string): Promise<boolean> {
    busy.value = true
    reset()
    try {
      await fn()
      return true
    } catch (err) {
      fromError(err, fallback)
      return false
    } finally {
      busy.value = false
    }
  }

  return { fields, problem, busy, ready, reset, fromIssues, fromError, run }
}

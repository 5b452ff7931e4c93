/**
 * Field messages for a form: from the shared zod schema before sending, and from the server's 422/413/415
 * answer (`data.fields`) after. Pages show `fields[name]` next to each input and `problem` above the button,
 * below the fields it sums up. A field's message goes as soon as the person changes that field (an input whose
 * `name` is the field's key), and the summary with the last of them.
 */
import { useEventListener } from '@vueuse/core'
import { fieldMessages, type ValidationIssue } from '#shared/utils/field-messages'

const FIELDS_SUMMARY = 'Please check the fields marked above.'

export function useFormFeedback() {
  const fields = ref<Record<string, string>>({})
  const problem = ref('')
  const busy = ref(false)
  /** false until the page is hydrated. app.vue now closes every field and button until then (its disabled
   *  fieldset), which covers what this guarded first: an early click or Enter falling back to a native GET submit
   *  with the fields (passwords) in the URL. Submit buttons still use it; it can go as they are next touched. */
  const ready = ref(false)
  onMounted(() => { ready.value = true })
  if (import.meta.client) {
    useEventListener(document, 'input', (ev: Event) => clearField((ev.target as HTMLInputElement | null)?.name), { passive: true })
    useEventListener(document, 'change', (ev: Event) => clearField((ev.target as HTMLInputElement | null)?.name), { passive: true })
  }

  /** Drops the message of a field the person has just changed; the summary goes with the last one. */
  function clearField(name: string | undefined) {
    if (!name || !(name in fields.value)) return
    const rest = Object.fromEntries(Object.entries(fields.value).filter(([k]) => k !== name))
    fields.value = rest
    if (!Object.keys(rest).some((k) => k !== '_') && problem.value === FIELDS_SUMMARY) problem.value = ''
  }

  function reset() {
    fields.value = {}
    problem.value = ''
  }

  /** Validation issues -> one message per field (the first, as the server answers). Returns false. */
  function fromIssues(issues: readonly ValidationIssue[]): false {
    fields.value = fieldMessages(issues)
    problem.value = FIELDS_SUMMARY
    return false
  }

  /** An ofetch error from one of our routes -> field messages and a summary line. */
  function fromError(err: unknown, fallback = 'Something went wrong. Please try again.') {
    const e = err as { data?: { message?: string; data?: { fields?: Record<string, string> } }; statusCode?: number }
    const f = { ...(e.data?.data?.fields ?? {}) }
    fields.value = f
    const named = Object.keys(f).filter((k) => k !== '_')
    problem.value = f._ ?? (named.length ? FIELDS_SUMMARY : (e.data?.message ?? fallback))
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

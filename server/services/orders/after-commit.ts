/**
 * Work that waits for the commit: calls to the payment service and e-mails. Running them inside the write
 * transaction would hold SQLite's one writer while the network answers, and a rollback cannot unsend them.
 */
import { stripeProblem } from '../../utils/stripe'

export type After = (() => Promise<unknown>)[]

/** Runs the after-commit tasks in order; a failure is logged and never undoes the committed change. */
export async function runAfter(tasks: After): Promise<void> {
  for (const task of tasks) {
    try {
      await task()
    } catch (err) {
      console.error('[boreline] after-commit task failed:', stripeProblem(err))
    }
  }
}

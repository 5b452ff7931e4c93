/**
 * POST /api/quotes/:id/job-card/complete  { odometer, checks: [key] } -> JobCardView (signed off).
 * Every check must be ticked; the odometer cannot be below the reading the car came in with.
 * 401; 422 with `data.fields` (`checks`, `odometer`); 404 not this garage's quote; 403 without `jobs.work`;
 * 409 not approved, or already signed off.
 */
import { JobCompleteSchema } from '#shared/schemas/jobs'
import { signOffJob } from '../../../../services/jobs/sign-off'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, JobCompleteSchema)
  const { auth, quote } = await loadOwnQuote(event, 'jobs.work')
  return signOffJob(quote, { userId: auth.user.id, organisationId: auth.org.id }, body)
})

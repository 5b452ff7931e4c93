/**
 * GET /api/quotes/:id/job-card -> JobCardView: the approved lines by wheel, declined ones as declined by the owner,
 * torques, fluid grade and capacity, bleeding sequence, checks, sign-off and the invoice's id once issued.
 * 401; 404 not this garage's quote; 403 without `jobs.work`; 409 not approved by the owner (or replaced).
 */
import { jobCardOf } from '../../../../services/jobs/job-card'

export default defineEventHandler(async (event) => {
  const { quote } = await loadOwnQuote(event, 'jobs.work')
  return jobCardOf(quote)
})

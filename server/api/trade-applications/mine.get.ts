/**
 * GET /api/trade-applications/mine -> ApplicationStatusView: where the caller's own garage application stands.
 * The one page a pending, rejected or suspended garage may still read. 401 signed out; 404 for distributor staff
 * (no application).
 */
import { applicationStatus } from '../../services/trade-applications'
import type { ApplicationStatusView } from '#shared/types/trade-accounts'

export default defineEventHandler(async (event): Promise<ApplicationStatusView> => {
  const { org } = requireAuth(event, { allowUnapproved: true })
  if (org.kind !== 'garage') throw notFound('Application')
  return applicationStatus(org)
})

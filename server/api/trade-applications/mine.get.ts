/**
 * GET /api/trade-applications/mine -> ApplicationStatusView: where the caller's own garage application stands.
 * The one page a pending, rejected or suspended garage may still read. 404 for distributor staff (no application).
 */
import { latestProof } from '../../services/trade-accounts'
import type { ApplicationStatusView } from '#shared/types/trade-accounts'

export default defineEventHandler(async (event): Promise<ApplicationStatusView> => {
  const { org } = requireAuth(event, { allowUnapproved: true })
  if (org.kind !== 'garage') throw notFound('Application')
  const doc = await latestProof(org.id)
  return {
    businessName: org.name, status: org.status, submittedAt: org.createdAt.toISOString(),
    decidedAt: org.decidedAt ? new Date(org.decidedAt).toISOString() : null, decisionReason: org.decisionReason ?? null,
    document: doc ? { originalName: doc.originalName, sizeBytes: doc.sizeBytes } : null,
  }
})

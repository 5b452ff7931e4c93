/**
 * GET /api/admin/trade-applications/:id/document -> the garage's proof-of-trade document, as a download.
 * Distributor staff only; 404 when the garage or its document is missing. Served as an attachment with the type
 * detected at upload, `nosniff` and a sandboxing CSP, so a crafted file cannot run in Boreline's origin; streamed,
 * with the original (possibly non-ASCII) name kept in `filename*`.
 */
import { stat } from 'node:fs/promises'
import { IdParamSchema } from '#shared/schemas/accounts'
import { findGarage, latestProof } from '../../../../services/trade-accounts'
import { openProof, proofPath } from '../../../../services/proof-store'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tradeAccounts.view')
  const { id } = paramsWith(event, IdParamSchema)
  const org = await findGarage(id)
  const doc = org ? await latestProof(org.id) : null
  if (!org || !doc) throw notFound('Document')
  const uploadsDir = String(useRuntimeConfig(event).uploadsDir)
  const size = await stat(proofPath(uploadsDir, doc.storedName)).then((s) => s.size).catch(() => null)
  if (size === null) throw notFound('Document')
  const ascii = doc.originalName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_')
  setResponseHeaders(event, {
    'content-type': doc.mime,
    'content-length': size,
    'content-disposition': `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(doc.originalName)}`,
    'x-content-type-options': 'nosniff',
    'content-security-policy': "default-src 'none'; sandbox",
    'cache-control': 'private, no-store',
  })
  return sendStream(event, openProof(uploadsDir, doc.storedName))
})

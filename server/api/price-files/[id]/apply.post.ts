/**
 * POST /api/price-files/:id/apply { excludeRejected?, confirmLargeChanges?, effectiveAt?, missingParts?: keep|discontinue }
 * -> { status: "applied" | "scheduled", priceFileId, priceVersionId, version, effectiveAt }
 * Writes the checked file as a new price version in one transaction (all rows or none), now or at
 * `effectiveAt`. Refused rows need excludeRejected, changes beyond +/-30 % need confirmLargeChanges (422
 * naming the field otherwise); a file checked against a version no longer in use must be checked again (409).
 * Admins get a summary e-mail. With BORELINE_TEST_HOOKS=1, the header `x-boreline-test-fail: apply-midway`
 * makes the apply throw inside its transaction (to prove nothing is left behind: 500, nothing changed).
 * Errors: 401, 403, 404, 409, 422, 500 (stopped and undone).
 */
import { ApplySchema, PriceFileIdParamsSchema } from '#shared/schemas/price-files'
import { applyPriceFile } from '../../../services/price-files/apply'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, PriceFileIdParamsSchema)
  const body = await bodyWith(event, ApplySchema)
  return applyPriceFile({
    priceFileId: id,
    userId: user.id,
    excludeRejected: body.excludeRejected,
    confirmLargeChanges: body.confirmLargeChanges,
    effectiveAt: body.effectiveAt ? new Date(body.effectiveAt) : null,
    missingParts: body.missingParts,
    failMidway: process.env.BORELINE_TEST_HOOKS === '1' && getRequestHeader(event, 'x-boreline-test-fail') === 'apply-midway',
  })
})

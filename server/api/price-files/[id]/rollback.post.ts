/**
 * POST /api/price-files/:id/rollback -> { status: "rolled_back", version, activeVersion } | { status: "ready" }
 * For an applied file whose version is in use: makes the version that was in use before it active again,
 * exactly, in one transaction, and undoes the part statuses the apply changed (admins get an e-mail).
 * For a scheduled file: cancels the schedule (the file can be applied again).
 * With BORELINE_TEST_HOOKS=1, the header `x-boreline-test-fail: rollback-midway` makes the roll back throw inside
 * its transaction. Errors: 401, 403, 404, 409 (not applied, not the version in use, or the first version).
 */
import { PriceFileIdParamsSchema } from '#shared/schemas/price-files'
import { findPriceFile } from '../../../services/price-files/present'
import { withdrawPriceFile } from '../../../services/price-files/rollback'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, PriceFileIdParamsSchema)
  const priceFile = await findPriceFile(id)
  const failMidway = process.env.BORELINE_TEST_HOOKS === '1' && getRequestHeader(event, 'x-boreline-test-fail') === 'rollback-midway'
  return withdrawPriceFile(priceFile, user.id, { failMidway })
})

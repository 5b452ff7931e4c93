/**
 * POST /api/price-files/:id/rollback -> { status: "rolled_back", version, activeVersion } | { status: "ready" }
 * For an applied file whose version is in use: makes the version that was in use before it active again,
 * exactly, in one transaction, and undoes the part statuses the apply changed (admins get an e-mail).
 * For a scheduled file: cancels the schedule (the file can be applied again).
 */
import { UploadIdParamsSchema } from '#shared/schemas/price-files'
import { PriceFile } from '../../../models/price-files'
import { cancelSchedule, rollbackPriceFile } from '../../../services/price-files/apply'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const up = await PriceFile.findByPk(id)
  if (!up) throw notFound('Price file')
  if (up.status === 'scheduled') {
    await cancelSchedule(id, user.id)
    return { status: 'ready' as const }
  }
  const failMidway = process.env.BORELINE_TEST_HOOKS === '1' && getRequestHeader(event, 'x-boreline-test-fail') === 'rollback-midway'
  return rollbackPriceFile(id, user.id, { failMidway })
})

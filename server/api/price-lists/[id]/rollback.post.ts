/**
 * POST /api/price-lists/:id/rollback -> { status: "rolled_back", version, activeVersion } | { status: "ready" }
 * For an applied file whose version is in use: makes the version that was in use before it active again,
 * exactly, in one transaction, and undoes the part statuses the apply changed (admins get an e-mail).
 * For a scheduled file: cancels the schedule (the file can be applied again).
 */
import { UploadIdParamsSchema } from '#shared/schemas/price-lists'
import { PriceUpload } from '../../../models/price-lists'
import { cancelSchedule, rollbackUpload } from '../../../services/price-lists/apply'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'priceLists.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const up = await PriceUpload.findByPk(id)
  if (!up) throw notFound('Price file')
  if (up.status === 'scheduled') {
    await cancelSchedule(id, user.id)
    return { status: 'ready' as const }
  }
  const failMidway = process.env.BORELINE_TEST_HOOKS === '1' && getRequestHeader(event, 'x-boreline-test-fail') === 'rollback-midway'
  return rollbackUpload(id, user.id, { failMidway })
})

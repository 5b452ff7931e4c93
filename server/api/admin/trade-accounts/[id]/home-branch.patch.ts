/**
 * PATCH /api/admin/trade-accounts/:id/home-branch { homeBranchId } -> TradeAccountDetail
 * Changes the branch that supplies the garage's orders (orders already placed keep theirs). Distributor admin;
 * 401; 403; 404 unknown garage; 409 pending or rejected (decided through the application) or changed meanwhile;
 * 422 unknown branch. Audited.
 */
import { HomeBranchSchema } from '#shared/schemas/orders'
import { IdParamSchema } from '#shared/schemas/accounts'
import { garageOr404 } from '../../../../services/trade-accounts'
import { changeHomeBranch } from '../../../../services/orders/home-branch'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const { homeBranchId } = await bodyWith(event, HomeBranchSchema)
  return changeHomeBranch(await garageOr404(id), homeBranchId, user.id)
})

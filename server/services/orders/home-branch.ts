/**
 * A garage's home branch: the branch that supplies its orders unless it names another. Set when its trade
 * application is approved (required) and changed by the distributor admin later, through the same guarded,
 * audited change as its terms (trade-account-changes.ts). Plain Node.
 */
import { Branch } from '../../models/accounts'
import type { TradeAccountDetail } from '../../../shared/types/trade-accounts'
import { conflict, invalidInput } from '../errors'
import { commitGarageChange } from '../trade-account-changes'
import { tradeAccountDetail, type Garage } from '../trade-accounts'

/** The branch by id, or 422 on `homeBranchId`. */
export async function chosenBranch(id: number): Promise<Branch> {
  const branch = await Branch.findByPk(id)
  if (!branch) throw invalidInput({ homeBranchId: 'Choose one of the distributor\'s branches.' })
  return branch
}

export async function changeHomeBranch(garage: Garage, homeBranchId: number, actorId: number): Promise<TradeAccountDetail> {
  if (garage.status !== 'approved' && garage.status !== 'suspended') {
    throw conflict('Only an approved or suspended trade account has a home branch to change; decide the application first.')
  }
  const branch = await chosenBranch(homeBranchId)
  if (garage.homeBranchId === branch.id) return tradeAccountDetail(garage)
  const before = garage.homeBranchId ? await Branch.findByPk(garage.homeBranchId) : null
  const fresh = await commitGarageChange(garage, { homeBranchId: branch.id }, {
    action: 'tradeAccount.home_branch_changed', actorId, changes: { homeBranch: { from: before?.name ?? null, to: branch.name } },
  })
  return tradeAccountDetail(fresh)
}

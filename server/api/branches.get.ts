/**
 * GET /api/branches -> BranchSchedule[]: the distributor's branches with their delivery runs (departure, cut-off,
 * transit, weekdays), counter hours for collection and transfer times. Any signed-in person of an approved
 * organisation (the order page, the approval form). 401; 403.
 */
import { branchSchedules } from '../services/orders/branches'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  return branchSchedules()
})

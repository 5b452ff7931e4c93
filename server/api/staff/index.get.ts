/**
 * GET /api/staff?page=&pageSize= -> StaffList: one page of the people of the caller's own organisation (removed
 * people left out), by name, with the roles the caller may give. Garage managers (their garage) and distributor
 * admins (the distributor); 401 / 403 otherwise; 422 bad query.
 */
import { PageQuerySchema } from '#shared/schemas/page'
import type { StaffList } from '#shared/types/trade-accounts'
import { listStaff } from '../../services/staff'

export default defineEventHandler(async (event): Promise<StaffList> => {
  const auth = requireStaffManager(event)
  return listStaff(auth, queryWith(event, PageQuerySchema))
})

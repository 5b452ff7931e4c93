/**
 * GET /api/staff -> StaffList: the people of the caller's own organisation (removed people left out), with
 * the roles the caller may give. Garage managers (their garage) and distributor admins (the distributor).
 */
import type { StaffList } from '#shared/types/trade-accounts'
import { User } from '../../models/accounts'
import { personView } from '../../services/trade-accounts'
import { assignableRoles, isManageable } from '../../services/staff'
import { Op } from 'sequelize'

export default defineEventHandler(async (event): Promise<StaffList> => {
  const auth = requireStaffManager(event)
  const people = await User.findAll({ where: { organisationId: auth.org.id, status: { [Op.ne]: 'removed' } }, order: [['name', 'ASC'], ['id', 'ASC']] })
  return {
    assignableRoles: assignableRoles(auth),
    data: people.map((p) => ({ ...personView(p), manageable: isManageable(auth, p), isYou: p.id === auth.user.id })),
  }
})

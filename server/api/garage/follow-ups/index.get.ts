/**
 * GET /api/garage/follow-ups?status=due|sent|held|stopped|all&page= -> Page<FollowUpView>: the reminders of
 * declined work, waiting ones soonest first (new declines are scheduled before the list is read).
 * 401; 403 without `followUps.manage` (managers); 422 bad query.
 */
import { FollowUpListQuerySchema } from '#shared/schemas/garage-vehicles'
import { listFollowUps } from '../../../services/follow-ups/list'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'followUps.manage')
  return listFollowUps(org.id, queryWith(event, FollowUpListQuerySchema))
})

/**
 * GET /api/garage/follow-ups/settings -> { advisedWeeks, requiredWeeks }: how long after a decline the reminder
 * is due. 401; 403 without `followUps.manage`.
 */
import { followUpWeeks } from '../../../services/follow-ups/settings'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'followUps.manage')
  return followUpWeeks(org.id)
})

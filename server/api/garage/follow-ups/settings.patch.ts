/**
 * PATCH /api/garage/follow-ups/settings  { advisedWeeks?, requiredWeeks? } -> the weeks now in force (for declines
 * scheduled from now on). 401; 403 without `followUps.manage`; 422 with `data.fields`.
 */
import { FollowUpSettingsSchema } from '#shared/schemas/garage-vehicles'
import { updateFollowUpWeeks } from '../../../services/follow-ups/settings'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'followUps.manage')
  const body = await bodyWith(event, FollowUpSettingsSchema)
  return updateFollowUpWeeks(user.id, org.id, body)
})

/**
 * GET /api/reminder-links/:token -> { garage, subscribed } (no sign-in: the token from a reminder e-mail is the
 * owner's key). 404 "This link is not valid" for any token that names no reminder.
 */
import { UnsubscribeParamsSchema } from '#shared/schemas/garage-vehicles'
import { reminderLink } from '../../../services/follow-ups/unsubscribe'

export default defineEventHandler(async (event) => {
  setResponseHeaders(event, { 'cache-control': 'no-store', 'referrer-policy': 'no-referrer' })
  const { token } = paramsWith(event, UnsubscribeParamsSchema)
  return reminderLink(token)
})

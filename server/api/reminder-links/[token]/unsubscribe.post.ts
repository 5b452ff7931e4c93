/**
 * POST /api/reminder-links/:token/unsubscribe -> { garage, subscribed: false } (no sign-in): the owner stops
 * reminders; consent is withdrawn with the time and "unsubscribe link", waiting follow-ups stop. Repeating it is
 * harmless. 404 "This link is not valid".
 */
import { UnsubscribeParamsSchema } from '#shared/schemas/garage-vehicles'
import { unsubscribe } from '../../../services/follow-ups/unsubscribe'

export default defineEventHandler(async (event) => {
  setResponseHeaders(event, { 'cache-control': 'no-store', 'referrer-policy': 'no-referrer' })
  const { token } = paramsWith(event, UnsubscribeParamsSchema)
  return unsubscribe(token)
})

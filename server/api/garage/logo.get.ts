/**
 * GET /api/garage/logo  -> the caller's garage's logo (its own people only), served inert (see sendGarageLogo).
 * 401; 403 without `quotes.draft`; 404 no logo.
 */
import { settingsOf } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'quotes.draft')
  return sendGarageLogo(event, await settingsOf(org.id))
})

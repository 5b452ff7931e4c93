/**
 * PATCH /api/account/profile { name?, phone? } -> PersonView. A person edits their own details only.
 * The schema is strict: anything else (`role`, `status`, `creditLimitMinor`, `organisationId`…) is refused
 * with 422 naming each field, and nothing changes. The session middleware brings the cookie's copy of the name in
 * step on the next request.
 */
import { ProfileSchema } from '#shared/schemas/accounts'
import { changeProfile } from '../../services/account'

export default defineEventHandler(async (event) => {
  const { user } = requireAuth(event)
  return changeProfile(user, await bodyWith(event, ProfileSchema))
})

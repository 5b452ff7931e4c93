/**
 * PATCH /api/account/profile { name?, phone? } -> PersonView. A person edits their own details only.
 * The schema is strict: anything else (`role`, `status`, `creditLimitMinor`, `organisationId`…) is refused
 * with 422 naming each field, and nothing changes.
 */
import { ProfileSchema } from '#shared/schemas/accounts'
import { User } from '../../models/accounts'
import { diff, personView } from '../../services/trade-accounts'

export default defineEventHandler(async (event) => {
  const { user } = requireAuth(event)
  const body = await bodyWith(event, ProfileSchema)
  const changes = diff({ name: user.name, phone: user.phone }, body)
  if (Object.keys(changes).length) {
    await withWrite(async (t) => {
      await User.update(body, { where: { id: user.id }, fields: ['name', 'phone'], transaction: t })
      await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.profile_changed', entity: 'user', entityId: user.id, changes })
    })
  }
  // the session middleware brings the cookie's copy of the name in step on the next request
  return personView((await User.findByPk(user.id))!)
})

/**
 * POST /api/auth/invitations/accept { token, password, name? } -> { accepted: true, email }
 * Uses the single-use invitation (410 when expired, used, unknown or the person was removed meanwhile),
 * sets the password and activates the person, who then signs in.
 */
import { AcceptInvitationSchema } from '#shared/schemas/accounts'
import { User } from '../../../models/accounts'
import { DEAD_LINK_MESSAGE, useToken } from '../../../services/tokens'

export default defineEventHandler(async (event) => {
  const { token, password, name } = await bodyWith(event, AcceptInvitationSchema)
  const passwordHash = await hashPassword(password)
  const user = await withWrite(async (t) => {
    const row = await useToken(t, token, 'invite')
    const user = row ? await User.findOne({ where: { id: row.userId, status: 'invited' }, transaction: t }) : null
    if (!user) throw new DomainError('gone', DEAD_LINK_MESSAGE)
    await User.update(
      { passwordHash, status: 'active', ...(name ? { name } : {}), sessionVersion: user.sessionVersion + 1 },
      { where: { id: user.id, status: 'invited' }, transaction: t },
    )
    await audit(t, {
      actorUserId: user.id, organisationId: user.organisationId, action: 'user.invitation_accepted', entity: 'user', entityId: user.id,
      changes: { status: { from: 'invited', to: 'active' }, ...(name && name !== user.name ? { name: { from: user.name, to: name } } : {}) },
    })
    return user
  })
  return { accepted: true, email: user.email }
})

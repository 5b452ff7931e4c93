/**
 * POST /api/staff { email, name, role } -> 201 PersonView (status "invited").
 * Invites a colleague by e-mail with a single-use link to set a password (valid 7 days). Inviting someone
 * already invited sends a fresh link; a removed colleague of the same organisation can be invited back.
 * 422 for a role the caller may not give or an e-mail that belongs to another account.
 */
import { UniqueConstraintError } from 'sequelize'
import { InviteSchema } from '#shared/schemas/accounts'
import { ROLE_LABELS } from '#shared/types/accounts'
import { User } from '../../models/accounts'
import { personView } from '../../services/trade-accounts'
import { assignableRoles } from '../../services/staff'
import { issueToken } from '../../services/tokens'
import { accountMail } from '../../services/account-mail'

const TAKEN = 'This e-mail already belongs to a Boreline account.'

export default defineEventHandler(async (event) => {
  const auth = requireStaffManager(event)
  const body = await bodyWith(event, InviteSchema)
  const roles = assignableRoles(auth)
  if (!roles.includes(body.role)) throw invalidInput({ role: `You can invite: ${roles.map((r) => ROLE_LABELS[r].toLowerCase()).join(' or ')}.` })

  const { person, token } = await withWrite(async (t) => {
    const existing = await User.findOne({ where: { email: body.email }, transaction: t })
    if (existing && (existing.organisationId !== auth.org.id || existing.status === 'active')) throw invalidInput({ email: TAKEN })
    let person: User
    if (existing) {
      await User.update(
        { name: body.name, role: body.role, status: 'invited', passwordHash: null, sessionVersion: existing.sessionVersion + 1 },
        { where: { id: existing.id }, transaction: t },
      )
      person = (await User.findByPk(existing.id, { transaction: t }))!
    } else {
      person = await User.create({ organisationId: auth.org.id, email: body.email, name: body.name, role: body.role, status: 'invited', passwordHash: null }, { transaction: t })
    }
    const token = await issueToken(t, person.id, 'invite', auth.user.id)
    await audit(t, {
      actorUserId: auth.user.id, organisationId: auth.org.id, action: 'user.invited', entity: 'user', entityId: person.id,
      changes: { email: body.email, role: { from: existing?.role ?? null, to: body.role }, status: { from: existing?.status ?? null, to: 'invited' } },
    })
    return { person, token }
  }).catch((err) => {
    if (err instanceof UniqueConstraintError) throw invalidInput({ email: TAKEN })
    throw err
  })

  await sendMail({
    to: person.email,
    ...accountMail.invitation({ name: person.name, inviter: auth.user.name, organisation: auth.org.name, role: person.role, url: appLink(`/invite/${token}`) }),
  })
  setResponseStatus(event, 201)
  return personView(person)
})

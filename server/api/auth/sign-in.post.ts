/**
 * POST /api/auth/sign-in { email, password }
 * One vague message on failure. A new session id at every sign-in (ASVS 7.2.4).
 */
import { SignInSchema } from '#shared/schemas/auth'
import { Organisation, User } from '../../models/accounts'

// verifying against a throw-away hash when the e-mail is unknown keeps the timing the same
let decoyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const body = await bodyWith(event, SignInSchema)
  const user = await User.findOne({ where: { email: body.email } })
  const hash = user?.passwordHash ?? await (decoyHash ??= hashPassword('decoy-password-never-used'))
  const passwordOk = await verifyPassword(hash, body.password)
  if (!user || !user.passwordHash || !passwordOk || user.status !== 'active') {
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'That e-mail and password do not match an account.' })
  }
  const org = await Organisation.findByPk(user.organisationId)
  if (!org) throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'That e-mail and password do not match an account.' })

  const config = useRuntimeConfig(event)
  const sid = await createSessionRecord(event, user, {
    idleMinutes: Number(config.sessionIdleMinutes), absoluteHours: Number(config.sessionAbsoluteHours),
  })
  await withWrite((t) => User.update({ lastSignInAt: new Date() }, { where: { id: user.id }, transaction: t }))
  const sessionUser = sessionUserOf(user, org)
  await replaceUserSession(event, { user: sessionUser, sid })
  return { user: sessionUser, organisationStatus: org.status }
})

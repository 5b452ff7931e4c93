/**
 * Checking a sign-in: one vague message on failure and the same work whether or not the e-mail is known; at most
 * 10 failed attempts per e-mail and per client address in 15 minutes (throttle.ts). People of a pending, rejected
 * or suspended garage may sign in: every route but their status page refuses them. Plain Node; the session itself
 * is the route's (it lives in the cookie).
 */
import { Organisation, User } from '../models/accounts'
import { withWrite } from '../utils/db'
import { unauthenticated } from './errors'
import { hashPasswordOutsideNitro, verifyPasswordOutsideNitro } from './password'
import { passwordAttempt } from './throttle'

const VAGUE = 'That e-mail and password do not match an account.'
// verifying against a throw-away hash when the e-mail is unknown keeps the timing the same
let decoyHash: Promise<string> | undefined

/** The person and their organisation for a right e-mail and password from `address` (the socket's); 401 / 429 otherwise. */
export async function checkSignIn(email: string, password: string, address: string): Promise<{ user: User; org: Organisation }> {
  const release = await passwordAttempt(email, address)
  const user = await User.findOne({ where: { email } })
  const hash = user?.passwordHash ?? await (decoyHash ??= hashPasswordOutsideNitro('decoy-password-never-used'))
  const passwordOk = await verifyPasswordOutsideNitro(hash, password)
  if (!user || !user.passwordHash || !passwordOk || user.status !== 'active') throw unauthenticated(VAGUE)
  const org = await Organisation.findByPk(user.organisationId)
  if (!org) throw unauthenticated(VAGUE)
  await release()
  await withWrite((t) => User.update({ lastSignInAt: new Date() }, { where: { id: user.id }, transaction: t }))
  return { user, org }
}

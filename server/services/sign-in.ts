/**
 * Checking a sign-in's password: one vague message on failure and the same work whether or not the e-mail is known;
 * throttled per e-mail and address, per address, and slowed per e-mail (throttle.ts). People of a pending, rejected
 * or suspended garage may sign in: every route but their status page refuses them. Plain Node; the second step
 * (sign-in-challenges.ts) and the session itself (it lives in the cookie) are the routes'.
 */
import { Organisation, User } from '../models/accounts'
import { withWrite } from '../utils/db'
import { unauthenticated } from './errors'
import { hashPasswordOutsideNitro, verifyPasswordOutsideNitro } from './password'
import { securityEvent } from './security-log'
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
  const org = user && user.passwordHash && passwordOk && user.status === 'active' ? await Organisation.findByPk(user.organisationId) : null
  if (!user || !org) {
    const reason = !user ? 'unknown e-mail' : !passwordOk ? 'wrong password' : 'not active'
    securityEvent('sign_in.failed', { email, address, reason, ...(user ? { userId: user.id } : {}) })
    throw unauthenticated(VAGUE)
  }
  await release()
  await withWrite((t) => User.update({ lastSignInAt: new Date() }, { where: { id: user.id }, transaction: t }))
  return { user, org }
}

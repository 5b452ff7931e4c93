/**
 * Runs on every request. (1) Refuses state-changing requests sent from another site (ASVS 3.5.2);
 * (2) resolves the caller from the sealed cookie *and* the server-side session record, loading role and
 * organisation status fresh from the database, into `event.context.auth` (null when signed out).
 */
import { Organisation, User } from '../models/accounts'

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
// machine-to-machine routes that legitimately come from elsewhere
const CROSS_SITE_ALLOWED = [/^\/api\/webhooks\//]

export default defineEventHandler(async (event) => {
  const path = event.path.split('?')[0]!
  if (UNSAFE.has(event.method) && !CROSS_SITE_ALLOWED.some((r) => r.test(path))) {
    const origin = getRequestHeader(event, 'origin')
    const site = getRequestHeader(event, 'sec-fetch-site')
    const own = getRequestURL(event).origin
    if ((origin && origin !== 'null' && origin !== own) || origin === 'null' || site === 'cross-site') {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Cross-site request refused.' })
    }
  }

  event.context.auth = null
  if (path === '/api/health') return
  await databaseReady()
  if (!path.startsWith('/api/') && !path.startsWith('/q/') && path !== '/' && path.includes('.')) return // static assets
  const session = await getUserSession(event)
  if (!session.user || !session.sid) return

  const config = useRuntimeConfig(event)
  const limits = { idleMinutes: Number(config.sessionIdleMinutes), absoluteHours: Number(config.sessionAbsoluteHours) }
  const user = await User.findByPk(session.user.id)
  const org = user ? await Organisation.findByPk(user.organisationId) : null
  const check = user && org && user.status === 'active'
    ? await checkSessionRecord(session.sid, user, limits)
    : { ok: false as const, reason: 'user gone' }
  if (!check.ok || !user || !org) {
    await clearUserSession(event)
    return
  }
  await touchSessionRecord(check.record)
  event.context.auth = { user, org, sessionId: session.sid }
  // keep the client's copy of role/name in step with the database (e.g. after a role change)
  const fresh = sessionUserOf(user, org)
  const u = session.user
  if (u.role !== fresh.role || u.name !== fresh.name || u.organisationId !== fresh.organisationId) {
    await setUserSession(event, { user: fresh })
  }
})

/**
 * Runs on every request. (1) Refuses state-changing requests sent from another site (ASVS 3.5.2);
 * (2) resolves the caller from the sealed cookie *and* the server-side session record, loading role and
 * organisation status fresh from the database, into `event.context.auth` (null when signed out).
 */
const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
// machine-to-machine routes that legitimately come from elsewhere
const CROSS_SITE_ALLOWED = [/^\/api\/webhooks\//]
let limits: SessionLimits | undefined

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

  limits ??= (() => {
    // read once: useRuntimeConfig(event) re-applies the environment on every call (measurable per request)
    const config = useRuntimeConfig()
    return { idleMinutes: Number(config.sessionIdleMinutes), absoluteHours: Number(config.sessionAbsoluteHours) }
  })()
  const check = await checkSessionRecord(session.sid, session.user.id, limits)
  if (!check.ok) {
    await clearUserSession(event)
    return
  }
  const { user, org } = check
  await touchSessionRecord(check.record)
  event.context.auth = { user, org, sessionId: session.sid }
  // keep the client's copy of role/name in step with the database (e.g. after a role change)
  const fresh = sessionUserOf(user, org)
  const u = session.user
  if (u.role !== fresh.role || u.name !== fresh.name || u.organisationId !== fresh.organisationId) {
    await setUserSession(event, { user: fresh, sid: session.sid })
  }
})

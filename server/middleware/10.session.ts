/**
 * Runs on every request. (1) Refuses state-changing requests sent from another site (ASVS 3.5.2);
 * (2) resolves the caller from the sealed cookie *and* the server-side session record, with role and
 * organisation status from the database, into `event.context.auth` (null when signed out).
 *
 * Both steps of (2) are remembered in memory (server/utils/session-cache.ts): an opened cookie by its exact text,
 * the session's rows until anything in those tables changes. State-changing requests always re-read the rows.
 */
import { parseCookies } from 'h3'
import { openedSession, rememberOpenedSession, type OpenedSession } from '../utils/session-cache'

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
// machine-to-machine routes that legitimately come from elsewhere
const CROSS_SITE_ALLOWED = [/^\/api\/webhooks\//]
let settings: { limits: SessionLimits; cookieName: string; maxAge?: number } | undefined

export default defineEventHandler(async (event) => {
  const path = event.path.split('?')[0]!
  const unsafe = UNSAFE.has(event.method)
  if (unsafe && !CROSS_SITE_ALLOWED.some((r) => r.test(path))) {
    const origin = getRequestHeader(event, 'origin')
    const site = getRequestHeader(event, 'sec-fetch-site')
    const own = getRequestURL(event).origin
    if ((origin && origin !== 'null' && origin !== own) || origin === 'null' || site === 'cross-site') {
      throw forbidden('Cross-site request refused.')
    }
  }

  event.context.auth = null
  if (path === '/api/health') return
  await databaseReady()
  if (!path.startsWith('/api/') && !path.startsWith('/q/') && path !== '/' && path.includes('.')) return // static assets

  settings ??= (() => {
    // read once: useRuntimeConfig(event) re-applies the environment on every call (measurable per request); with
    // the event, so the cookie name set at start for HTTPS (plugins/00.https-cookies.ts) is the one read
    const config = useRuntimeConfig(event)
    const s = config.session as { name?: string; maxAge?: number }
    return {
      limits: { idleMinutes: Number(config.sessionIdleMinutes), absoluteHours: Number(config.sessionAbsoluteHours) },
      cookieName: s.name || 'h3', maxAge: s.maxAge,
    }
  })()
  // no cookie, no session: asking h3 anyway would mint, seal and send an empty session to every visitor
  const sealed = parseCookies(event)[settings.cookieName]
  if (!sealed) return
  const known = openedSession(sealed)
  if (known) {
    // h3 looks here before opening the cookie itself (event.context.sessions[name]), so the work is skipped
    const sessions = (event.context.sessions ??= Object.create(null)) as Record<string, OpenedSession>
    sessions[settings.cookieName] = known
  }
  const session = await getUserSession(event)
  if (!session.user || !session.sid) return
  if (!known) rememberOpenedSession(sealed, (event.context.sessions as Record<string, OpenedSession>)[settings.cookieName]!, settings.maxAge)

  const check = await checkSessionRecord(session.sid, session.user.id, settings.limits, new Date(), { fresh: unsafe })
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

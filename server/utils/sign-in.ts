/**
 * The cookie side of signing in (auto-imported by the auth routes): the client's address as the throttles see it,
 * the short-lived cookie of a half-signed sign-in (its value is a random token; the database keeps its hash,
 * server/services/sign-in-challenges.ts), and starting the session once every step is done.
 */
import type { H3Event } from 'h3'
import { deleteCookie, getCookie, getRequestIP, setCookie } from 'h3'
import type { Organisation, User } from '../models/accounts'
import type { SignedIn } from '../../shared/types/second-factor'
import { createSessionRecord, revokeSessionRecord, sessionUserOf } from './sessions'

/** The socket's address: X-Forwarded-For is whatever the caller wants it to be. */
export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: false }) ?? ''
}

/** Over HTTPS cookies carry the `__Host-` prefix: Secure, for this host only, path `/`, never set by a subdomain. */
export function servedOverHttps(event?: H3Event): boolean {
  return String(useRuntimeConfig(event).publicOrigin).startsWith('https://')
}

const challengeCookie = (event: H3Event) => (servedOverHttps(event) ? '__Host-boreline-mfa' : 'boreline-mfa')
const COOKIE = { httpOnly: true, secure: true, sameSite: 'strict', path: '/' } as const

export function setChallengeCookie(event: H3Event, token: string, maxAgeSeconds: number): void {
  setCookie(event, challengeCookie(event), token, { ...COOKIE, maxAge: maxAgeSeconds })
}

export function challengeToken(event: H3Event): string | undefined {
  return getCookie(event, challengeCookie(event)) || undefined
}

export function clearChallengeCookie(event: H3Event): void {
  deleteCookie(event, challengeCookie(event), COOKIE)
}

/**
 * Starts the session of a person who passed every step: a new session id (ASVS 7.2.4), and the session this browser
 * held before ends.
 */
export async function completeSignIn(event: H3Event, user: User, org: Organisation): Promise<SignedIn> {
  const previous = await getUserSession(event)
  if (previous.sid) await revokeSessionRecord(previous.sid)
  const config = useRuntimeConfig(event)
  const sid = await createSessionRecord(event, user, {
    idleMinutes: Number(config.sessionIdleMinutes), absoluteHours: Number(config.sessionAbsoluteHours),
  })
  const sessionUser = sessionUserOf(user, org)
  await replaceUserSession(event, { user: sessionUser, sid })
  return { user: sessionUser, organisationStatus: org.status }
}

/**
 * Whoever clears the session cookie (our sign-out, the module's own `DELETE /api/_auth/session`, the session
 * middleware dropping a dead session) also ends the server-side record, so the old cookie is worthless.
 */
export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (session) => {
    const sid = (session as { sid?: unknown }).sid
    if (typeof sid === 'string' && sid) await revokeSessionRecord(sid)
  })
})

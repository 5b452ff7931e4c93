/** POST /api/auth/sign-out: revokes the server-side record, so a replayed cookie is refused afterwards. */
export default defineEventHandler(async (event) => {
  const session = await getUserSession(event)
  if (session.sid) await revokeSessionRecord(session.sid)
  await clearUserSession(event)
  return { signedOut: true }
})

/** GET /api/me: the signed-in person and their organisation's standing (pending garages may read this). */
export default defineEventHandler((event) => {
  const { user, org } = requireAuth(event, { allowUnapproved: true })
  return {
    user: sessionUserOf(user, org),
    email: user.email,
    organisation: { id: org.id, name: org.name, kind: org.kind, status: org.status, decisionReason: org.decisionReason ?? null },
  }
})

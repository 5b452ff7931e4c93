/**
 * Signing out from any page: the server revokes the session record (a replayed cookie is refused afterwards),
 * the client forgets its copy, and the person lands on the sign-in page. A failed request still clears the
 * client side: the person asked to leave.
 */
export function useSignOut() {
  const { clear } = useUserSession()
  return async function signOut(): Promise<void> {
    await api('/api/auth/sign-out', { method: 'POST' }).catch(() => {})
    await clear()
    await navigateTo('/sign-in')
  }
}

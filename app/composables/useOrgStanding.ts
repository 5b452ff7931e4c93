import type { OrgStatus } from '#shared/types/accounts'

/**
 * The signed-in person's organisation status, fresh from the server (`/api/me`) at every navigation. Only for
 * steering the UI (a pending garage is sent to its status page); the server refuses everything else anyway.
 */
export function useOrgStanding() {
  const status = useState<OrgStatus | null>('org-standing', () => null)
  const requestFetch = useRequestFetch()
  async function refresh(): Promise<OrgStatus | null> {
    try {
      const me = await requestFetch<{ organisation: { status: OrgStatus } }>('/api/me')
      status.value = me.organisation.status
    } catch {
      status.value = null
    }
    return status.value
  }
  return { status, refresh }
}

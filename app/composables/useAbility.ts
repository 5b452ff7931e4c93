import { can, type Ability } from '#shared/utils/abilities'

/** Client-side check used only to hide controls; the server decides for real on every route. */
export function useAbility() {
  const { user } = useUserSession()
  return {
    can: (ability: Ability) => can(user.value?.role, ability),
    side: computed(() => user.value?.organisationKind ?? null),
  }
}

/**
 * Client-side steering only (the server decides on every route):
 * - pages with `meta.signedIn` or `meta.ability(ies)` send signed-out visitors to the sign-in page;
 * - a garage that is not approved sees only its status page (and the public pages); a suspended one also its
 *   statement and documents;
 * - a page whose ability the role lacks sends the person home.
 */
import { can, type Ability } from '#shared/utils/abilities'

const OPEN = [/^\/sign-in/, /^\/forgot-password/, /^\/reset\//, /^\/invite\//, /^\/apply/, /^\/trade-application$/]
/** what a suspended garage may still open, to settle what it owes */
const SUSPENDED_OPEN = [/^\/statement$/, /^\/documents$/]

declare module '#app' {
  interface PageMeta {
    signedIn?: boolean
    /** any one of these abilities lets the person see the page */
    abilities?: Ability[]
  }
}

export default defineNuxtRouteMiddleware(async (to) => {
  const { loggedIn, user } = useUserSession()
  const standing = useOrgStanding()
  const needs = to.meta.abilities
  if (!loggedIn.value) {
    standing.status.value = null
    if (to.meta.signedIn || needs?.length) return navigateTo({ path: '/sign-in', query: { next: to.fullPath } })
    return
  }
  if (user.value?.organisationKind === 'garage') {
    const status = await standing.refresh()
    const open = status === 'suspended' ? [...OPEN, ...SUSPENDED_OPEN] : OPEN
    if (status && status !== 'approved' && !open.some((r) => r.test(to.path))) return navigateTo('/trade-application')
  } else {
    standing.status.value = null
  }
  if (needs?.length && !needs.some((a) => can(user.value?.role, a))) return navigateTo('/')
})

/**
 * The main navigation. Each entry names the ability it needs (shared/utils/abilities.ts) and which side of the
 * trade sees it; the header shows only what the signed-in person may use. Add an entry when a page lands.
 */
import type { Ability } from '#shared/utils/abilities'
import type { OrgKind } from '#shared/types/accounts'

export interface NavEntry {
  to: string
  label: string
  ability: Ability
  side: OrgKind | 'both'
}

export const NAV_ENTRIES: NavEntry[] = []

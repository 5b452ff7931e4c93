/** What every catalogue route reads first: prices the caller may see, the active price version, and fresh caches. */
import type { Organisation, User } from '../../models/accounts'
import { noteRevision } from './changes'
import { pricingContext, type PricingContext } from './pricing'

export async function catalogueContext(user: Pick<User, 'role'>, org: Pick<Organisation, 'kind' | 'tierId' | 'techniciansSeePrices'>): Promise<PricingContext> {
  const ctx = await pricingContext(user, org)
  noteRevision(ctx.revision)
  return ctx
}

/**
 * POST /api/admin/trade-accounts/:id/suspend { reason } -> TradeAccountDetail. Approved -> suspended (409 otherwise).
 * From the next request on, every route refuses the garage's people with 403 (status is read from the
 * database on every request): no new sign-in needed, and they still see why on their status page.
 */
import { IdParamSchema, SuspendSchema } from '#shared/schemas/accounts'
import { Organisation } from '../../../../models/accounts'
import { findGarage, tradeAccountDetail, garageRecipients } from '../../../../services/trade-accounts'
import { accountMail } from '../../../../services/account-mail'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const { reason } = await bodyWith(event, SuspendSchema)
  const org = await findGarage(id)
  if (!org) throw notFound('Trade account')
  if (org.status !== 'approved') throw conflict(`Only an approved account can be suspended (this one is ${org.status}).`)
  await withWrite(async (t) => {
    const [changed] = await Organisation.update({ status: 'suspended', decisionReason: reason }, { where: { id: org.id, status: 'approved' }, transaction: t })
    if (changed !== 1) throw conflict('The account changed meanwhile; reload and try again.')
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, entity: 'organisation', entityId: org.id, action: 'account.suspended',
      changes: { status: { from: 'approved', to: 'suspended' }, reason },
    })
  })
  const fresh = (await findGarage(org.id))!
  await sendMail({ to: await garageRecipients(fresh), ...accountMail.suspended({ businessName: fresh.name, reason }) })
  return tradeAccountDetail(fresh)
})

/** POST /api/admin/trade-accounts/:id/reactivate { note? } -> TradeAccountDetail. Suspended -> approved (409 otherwise). Audited, e-mailed. */
import { IdParamSchema, ReactivateSchema } from '#shared/schemas/accounts'
import { Organisation } from '../../../../models/accounts'
import { findGarage, tradeAccountDetail, garageRecipients } from '../../../../services/trade-accounts'
import { accountMail } from '../../../../services/account-mail'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const { note } = await bodyWith(event, ReactivateSchema)
  const org = await findGarage(id)
  if (!org) throw notFound('Trade account')
  if (org.status !== 'suspended') throw conflict(`Only a suspended account can be reactivated (this one is ${org.status}).`)
  await withWrite(async (t) => {
    const [changed] = await Organisation.update({ status: 'approved', decisionReason: null }, { where: { id: org.id, status: 'suspended' }, transaction: t })
    if (changed !== 1) throw conflict('The account changed meanwhile; reload and try again.')
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, entity: 'organisation', entityId: org.id, action: 'account.reactivated',
      changes: { status: { from: 'suspended', to: 'approved' }, ...(note ? { note } : {}) },
    })
  })
  const fresh = (await findGarage(org.id))!
  await sendMail({ to: await garageRecipients(fresh), ...accountMail.reactivated({ businessName: fresh.name, signInUrl: appLink('/sign-in') }) })
  return tradeAccountDetail(fresh)
})

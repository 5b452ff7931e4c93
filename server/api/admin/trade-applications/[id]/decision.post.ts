/**
 * POST /api/admin/trade-applications/:id/decision
 *   { decision: "approve", tierId, terms: "card" | "account", creditLimitMinor?, paymentDays?, reason? }
 *   { decision: "reject", reason }
 * -> the updated TradeAccountDetail. Distributor admin only. 404 unknown garage; 409 when the application is no
 * longer pending (decided already, twice, or suspended); 422 for bad terms or an unknown tier.
 * The status moves with a guarded UPDATE (… WHERE status = 'pending'), so two admins cannot both decide.
 * The decision is audited; the garage is e-mailed after the commit either way.
 */
import { DecisionSchema, IdParamSchema } from '#shared/schemas/accounts'
import { DiscountTier, Organisation } from '../../../../models/accounts'
import { findGarage, tradeAccountDetail, garageRecipients } from '../../../../services/trade-accounts'
import { accountMail, termsSentence } from '../../../../services/account-mail'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, DecisionSchema)
  const org = await findGarage(id)
  if (!org) throw notFound('Application')
  if (org.status !== 'pending') throw conflict(`This application has already been decided (${org.status}).`)

  const now = new Date()
  const tier = body.decision === 'approve' ? await DiscountTier.findByPk(body.tierId) : null
  if (body.decision === 'approve' && !tier) throw invalidInput({ tierId: 'That discount tier does not exist any more.' })

  await withWrite(async (t) => {
    const values = body.decision === 'approve'
      ? {
          status: 'approved' as const, tierId: tier!.id, paymentTerms: body.terms,
          creditLimitMinor: body.terms === 'account' ? body.creditLimitMinor! : 0,
          paymentDays: body.terms === 'account' ? body.paymentDays! : 0,
          decisionReason: body.reason || null, decidedAt: now,
        }
      : { status: 'rejected' as const, decisionReason: body.reason, decidedAt: now }
    const [changed] = await Organisation.update(values, { where: { id: org.id, status: 'pending' }, transaction: t })
    if (changed !== 1) throw conflict('This application has already been decided.')
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, entity: 'organisation', entityId: org.id,
      action: body.decision === 'approve' ? 'application.approved' : 'application.rejected',
      changes: body.decision === 'approve'
        ? {
            status: { from: 'pending', to: 'approved' },
            tier: { from: null, to: `${tier!.name} (${tier!.percentBp / 100} %)` },
            terms: { from: null, to: values.paymentTerms },
            creditLimitMinor: { from: 0, to: (values as { creditLimitMinor: number }).creditLimitMinor },
            paymentDays: { from: 0, to: (values as { paymentDays: number }).paymentDays },
            ...(body.reason ? { note: body.reason } : {}),
          }
        : { status: { from: 'pending', to: 'rejected' }, reason: body.reason },
    })
  })

  const fresh = (await findGarage(org.id))!
  const config = useRuntimeConfig(event)
  const money = { currency: String(config.public.currency), locale: String(config.public.locale) }
  const mail = fresh.status === 'approved'
    ? accountMail.approved({
        businessName: fresh.name, tierName: tier!.name, percentBp: tier!.percentBp, signInUrl: appLink('/sign-in'),
        terms: termsSentence(fresh.paymentTerms, fresh.creditLimitMinor, fresh.paymentDays, money),
      })
    : accountMail.rejected({ businessName: fresh.name, reason: fresh.decisionReason ?? '', applyUrl: appLink('/apply') })
  await sendMail({ to: await garageRecipients(fresh), ...mail })
  return tradeAccountDetail(fresh)
})

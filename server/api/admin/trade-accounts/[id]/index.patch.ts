/**
 * PATCH /api/admin/trade-accounts/:id { tierId?, terms?, creditLimitMinor?, paymentDays? } -> TradeAccountDetail.
 * Changes the tier and/or payment terms of an approved or suspended account (409 for pending/rejected:
 * those are decided through the application). Terms must agree after the change (422). Audited with the
 * fields that changed; the garage is told by e-mail.
 */
import { TradeTermsSchema, IdParamSchema } from '#shared/schemas/accounts'
import { DiscountTier, Organisation } from '../../../../models/accounts'
import { diff, findGarage, tradeAccountDetail, garageRecipients } from '../../../../services/trade-accounts'
import { accountMail, termsSentence } from '../../../../services/account-mail'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, TradeTermsSchema)
  const org = await findGarage(id)
  if (!org) throw notFound('Trade account')
  if (org.status !== 'approved' && org.status !== 'suspended') {
    throw conflict('Only approved or suspended accounts have terms to change; decide the application first.')
  }
  const tier = body.tierId ? await DiscountTier.findByPk(body.tierId) : org.tier ?? null
  if (body.tierId && !tier) throw invalidInput({ tierId: 'That discount tier does not exist any more.' })

  const terms = body.terms ?? org.paymentTerms
  const next = {
    tierId: tier?.id ?? null,
    paymentTerms: terms,
    creditLimitMinor: terms === 'card' ? 0 : (body.creditLimitMinor ?? org.creditLimitMinor),
    paymentDays: terms === 'card' ? 0 : (body.paymentDays ?? org.paymentDays),
  }
  const problems: Record<string, string> = {}
  if (terms === 'account' && next.creditLimitMinor <= 0) problems.creditLimitMinor = 'A trade account needs a credit limit above zero.'
  if (terms === 'account' && next.paymentDays <= 0) problems.paymentDays = 'A trade account needs the days to pay.'
  if (terms === 'card' && (body.creditLimitMinor || body.paymentDays)) {
    if (body.creditLimitMinor) problems.creditLimitMinor = 'Card-only accounts have no credit limit.'
    if (body.paymentDays) problems.paymentDays = 'Card-only accounts have no days to pay.'
  }
  if (Object.keys(problems).length) throw invalidInput(problems)

  const before = { tierId: org.tierId ?? null, paymentTerms: org.paymentTerms, creditLimitMinor: org.creditLimitMinor, paymentDays: org.paymentDays }
  const changes = diff(before, next)
  if (!Object.keys(changes).length) return tradeAccountDetail(org)
  if (changes.tierId) changes.tierId = { from: org.tier ? `${org.tier.name} (${org.tier.percentBp / 100} %)` : null, to: `${tier!.name} (${tier!.percentBp / 100} %)` }

  await withWrite(async (t) => {
    const [changed] = await Organisation.update(next, { where: { id: org.id, status: org.status }, transaction: t })
    if (changed !== 1) throw conflict('The account changed meanwhile; reload and try again.')
    await audit(t, { actorUserId: user.id, organisationId: org.id, entity: 'organisation', entityId: org.id, action: 'account.terms_changed', changes })
  })
  const fresh = (await findGarage(org.id))!
  const config = useRuntimeConfig(event)
  const money = { currency: String(config.public.currency), locale: String(config.public.locale) }
  await sendMail({
    to: await garageRecipients(fresh),
    ...accountMail.termsChanged({
      businessName: fresh.name, tierName: fresh.tier?.name ?? 'none', percentBp: fresh.tier?.percentBp ?? 0,
      terms: termsSentence(fresh.paymentTerms, fresh.creditLimitMinor, fresh.paymentDays, money),
    }),
  })
  return tradeAccountDetail(fresh)
})

/**
 * PATCH /api/garage/settings  { labourRateMinor?, markupRules?, taxRateBp?, quoteValidityDays?, quoteTerms?, techniciansSeePrices? }
 * Managers only. New values apply to lines added from now on: lines already on quotes keep the net price,
 * markup, rate and tax they were added with. -> GarageSettingsView.
 * 401; 422 with `data.fields`; 403 without `garage.settings`.
 */
import { GarageSettingsUpdateSchema } from '#shared/schemas/quotes'
import { Organisation } from '../../models/accounts'
import { garageSettingsView } from '../../services/garage-settings'
import { settingsRowFor } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, GarageSettingsUpdateSchema)
  const { user, org } = requireAbility(event, 'garage.settings')
  let seesPrices = !!org.techniciansSeePrices // auth.org is a read-only snapshot of the session's organisation
  await withWrite(async (t) => {
    const row = await settingsRowFor(t, org.id)
    const before = { labourRateMinor: row.labourRateMinor, taxRateBp: row.taxRateBp, quoteValidityDays: row.quoteValidityDays, markupRules: JSON.stringify(row.markupRules), techniciansSeePrices: seesPrices }
    const { techniciansSeePrices, ...own } = body
    row.set(Object.fromEntries(Object.entries(own).filter(([, v]) => v !== undefined)))
    await row.save({ transaction: t })
    if (techniciansSeePrices !== undefined) {
      await Organisation.update({ techniciansSeePrices }, { where: { id: org.id }, transaction: t })
      seesPrices = techniciansSeePrices
    }
    const after = { labourRateMinor: row.labourRateMinor, taxRateBp: row.taxRateBp, quoteValidityDays: row.quoteValidityDays, markupRules: JSON.stringify(row.markupRules), techniciansSeePrices: seesPrices }
    const changes = Object.fromEntries(Object.entries(after).filter(([k, v]) => before[k as keyof typeof before] !== v).map(([k, v]) => [k, { from: before[k as keyof typeof before], to: v }]))
    if (body.quoteTerms !== undefined) Object.assign(changes, { quoteTerms: 'changed' })
    await audit(t, { actorUserId: user.id, organisationId: org.id, action: 'garage.settings.update', entity: 'garage_settings', entityId: org.id, changes })
  })
  return garageSettingsView((await Organisation.findByPk(org.id)) ?? org, quoteCurrency())
})

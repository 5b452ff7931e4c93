/**
 * The garage settings page (managers): what it reads, saving the quoting settings and the technicians' view of
 * trade prices (the organisation's flag, shared with the catalogue), and changing the logo. New values apply
 * to lines added from then on; lines already on quotes keep theirs. Every change is audited.
 */
import type { IncomingMessage } from 'node:http'
import { Organisation } from '../models/accounts'
import { GarageSettings } from '../models/quotes'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import type { GarageSettingsUpdateInput } from '../../shared/schemas/quotes'
import type { GarageSettingsView } from '../../shared/types/quotes'
import { receiveLogo, removeLogo } from './garage-logo'
import { settingsOf, settingsRowFor } from './quotes/settings'
import type { QuoteActor } from './quotes/revisions'

export async function garageSettingsView(org: Organisation, currency: string): Promise<GarageSettingsView> {
  const s = await settingsOf(org.id)
  return {
    organisationName: org.name,
    labourRateMinor: s.labourRateMinor,
    markupRules: s.markupRules,
    taxRateBp: s.taxRateBp,
    pricesIncludeTax: s.pricesIncludeTax,
    partPriceEndingMinor: s.partPriceEndingMinor,
    coreDepositsPassedOn: s.coreDepositsPassedOn,
    quoteValidityDays: s.quoteValidityDays,
    quoteTerms: s.quoteTerms,
    techniciansSeePrices: !!org.techniciansSeePrices,
    logo: s.logoFile && s.logoMime
      ? { url: `/api/garage/logo?v=${s.logoUpdatedAt ? new Date(s.logoUpdatedAt).getTime() : 0}`, mime: s.logoMime, updatedAt: new Date(s.logoUpdatedAt ?? Date.now()).toISOString() }
      : null,
    currency,
  }
}

type Audited = Record<'labourRateMinor' | 'taxRateBp' | 'quoteValidityDays' | 'markupRules' | 'techniciansSeePrices'
  | 'pricesIncludeTax' | 'partPriceEnding' | 'coreDepositsPassedOn', unknown>

const audited = (row: GarageSettings, techniciansSeePrices: boolean): Audited => ({
  labourRateMinor: row.labourRateMinor, taxRateBp: row.taxRateBp, quoteValidityDays: row.quoteValidityDays,
  markupRules: JSON.stringify(row.markupRules), techniciansSeePrices, pricesIncludeTax: !!row.pricesIncludeTax,
  partPriceEnding: row.partPriceEnding ?? null, coreDepositsPassedOn: !!row.coreDepositsPassedOn,
})

/** Saves the settings given; returns the organisation as it now is (the session's copy is a read-only snapshot). */
export async function updateGarageSettings(actor: QuoteActor, input: GarageSettingsUpdateInput): Promise<Organisation> {
  const { user, org } = actor
  await withWrite(async (t) => {
    const row = await settingsRowFor(t, org.id)
    const { techniciansSeePrices, partPriceEndingMinor, ...own } = input
    const before = audited(row, !!org.techniciansSeePrices)
    row.set(Object.fromEntries(Object.entries(own).filter(([, v]) => v !== undefined)))
    if (partPriceEndingMinor !== undefined) row.partPriceEnding = partPriceEndingMinor
    await row.save({ transaction: t })
    if (techniciansSeePrices !== undefined) await Organisation.update({ techniciansSeePrices }, { where: { id: org.id }, transaction: t })
    const after = audited(row, techniciansSeePrices ?? !!org.techniciansSeePrices)
    const changes: Record<string, unknown> = Object.fromEntries(Object.entries(after)
      .filter(([k, v]) => before[k as keyof Audited] !== v).map(([k, v]) => [k, { from: before[k as keyof Audited], to: v }]))
    if (input.quoteTerms !== undefined) changes.quoteTerms = 'changed'
    await audit(t, { actorUserId: user.id, organisationId: org.id, action: 'garage.settings.update', entity: 'garage_settings', entityId: org.id, changes })
  })
  return (await Organisation.findByPk(org.id)) ?? org
}

/** Records the logo file (or none) on the settings; returns the file it replaces. */
async function recordLogo(actor: QuoteActor, logo: { file: string; mime: string; size: number } | null): Promise<string | null> {
  const { user, org } = actor
  return withWrite(async (t) => {
    const row = logo ? await settingsRowFor(t, org.id) : await GarageSettings.findOne({ where: { organisationId: org.id }, transaction: t })
    if (!row || (!logo && !row.logoFile)) return null
    const previous = row.logoFile ?? null
    await GarageSettings.update({ logoFile: logo?.file ?? null, logoMime: logo?.mime ?? null, logoUpdatedAt: new Date() }, { where: { id: row.id }, transaction: t })
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, action: logo ? 'garage.logo.upload' : 'garage.logo.remove', entity: 'garage_settings', entityId: org.id,
      ...(logo ? { changes: { mime: logo.mime, size: logo.size } } : {}),
    })
    return previous
  })
}

/**
 * Takes a new logo from the upload (checked by its bytes) in place of the old one, which is removed once the
 * new one is recorded; a refused or failed upload leaves the old logo as it was.
 */
export async function replaceGarageLogo(actor: QuoteActor, req: IncomingMessage, uploadsDir: string): Promise<void> {
  const logo = await receiveLogo(req, uploadsDir)
  let previous: string | null
  try {
    previous = await recordLogo(actor, logo)
  } catch (err) {
    await removeLogo(uploadsDir, logo.file)
    throw err
  }
  await removeLogo(uploadsDir, previous)
}

/** Takes the logo off the garage's quotes and removes its file. */
export async function removeGarageLogo(actor: QuoteActor, uploadsDir: string): Promise<void> {
  await removeLogo(uploadsDir, await recordLogo(actor, null))
}

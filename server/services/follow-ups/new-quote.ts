/**
 * The fresh quote a reminder links to: a new quote (the garage's next number) for the same garage vehicle with the
 * declined lines offered again at today's prices, sent at once so its owner's link works. Runs inside the caller's
 * write transaction; a part that can no longer be priced is left out. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Organisation } from '../../models/accounts'
import type { FollowUp, GarageCustomer, GarageVehicle } from '../../models/garage-vehicles'
import { Quote, QuoteLine } from '../../models/quotes'
import { addLine, newQuoteToken, nextQuoteNumber, settingsOf, type NewLine } from '../quotes'
import { isDomainError } from '../errors'

const DAY_MS = 86_400_000

/** The declined line offered again, as a new line's input (none for a kind that cannot be offered again). */
function againOf(l: QuoteLine): NewLine | null {
  const common = { recommendation: l.recommendation ?? null, reason: l.reason ?? null }
  if (l.kind === 'part' && l.sku) return { kind: 'part', sku: l.sku, quantity: l.quantity, ...common }
  if (l.kind === 'labour' && l.hoursHundredths) return { kind: 'labour', description: l.description, hours: l.hoursHundredths / 100, ...common }
  if (l.kind === 'sundry') return { kind: 'sundry', description: l.description, quantity: l.quantity, amountMinor: l.unitPriceMinor, ...common }
  return null
}

export interface FreshQuote { quote: Quote; token: string; offered: number }

/** A new sent quote for the follow-ups of one vehicle; `offered` is 0 when nothing could be offered again. */
export async function freshQuoteFor(t: Transaction, followUps: FollowUp[], v: GarageVehicle, owner: GarageCustomer, now: Date): Promise<FreshQuote> {
  const organisationId = v.organisationId
  const org = (await Organisation.findByPk(organisationId, { transaction: t }))!
  const sources = await QuoteLine.findAll({ where: { id: followUps.map((f) => f.quoteLineId) }, order: [['position', 'ASC'], ['id', 'ASC']], transaction: t })
  const latest = (await Quote.findByPk(Math.max(...followUps.map((f) => f.quoteId)), { transaction: t }))!
  const quote = await Quote.create({
    organisationId, number: await nextQuoteNumber(t, organisationId), status: 'draft', garageVehicleId: v.id,
    vehicleId: latest.vehicleId, vehicleLabel: latest.vehicleLabel, registration: latest.registration,
    ownerName: owner.name, ownerEmail: owner.email, ownerPhone: owner.phone,
    messageToOwner: 'The work below was recommended at your last visit and not yet done. Approve what you would like us to do now.',
    createdByUserId: latest.createdByUserId,
  }, { transaction: t })
  let offered = 0
  for (const source of sources) {
    const again = againOf(source)
    if (!again) continue
    try {
      await addLine(t, quote, org, again)
      offered++
    } catch (err) {
      // a part withdrawn or no longer priced is not offered again; anything else is a fault
      if (!isDomainError(err)) throw err
    }
  }
  const settings = await settingsOf(organisationId, t)
  const link = newQuoteToken()
  await quote.update({ status: 'sent', tokenHash: link.hash, sentAt: now, expiresAt: new Date(now.getTime() + settings.quoteValidityDays * DAY_MS) }, { transaction: t })
  return { quote, token: link.token, offered }
}

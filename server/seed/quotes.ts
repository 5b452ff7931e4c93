/**
 * Demo quotes for Millbrook Motor Works (Silver tier): its quoting settings and five quotes in different states
 * (a draft, one with the owner, one partly approved, one expired, and one replaced by a second revision), priced
 * through the same service as the routes, from the demo catalogue's parts. Idempotent: the settings are created
 * only when missing, the quotes only when the garage has none yet. The owner's link of the quote that is with
 * the owner is printed once, when it is made (only its hash is stored).
 */
import type { Transaction } from 'sequelize'
import { Organisation, User } from '../models/accounts'
import { Fitment, Part, Vehicle } from '../models/catalogue'
import { GarageSettings, Quote, QuoteLine } from '../models/quotes'
import { addLine, changeLine, isDecidable, linesOf, newQuoteToken, reviseQuote, type NewLine } from '../services/quotes'
import { vehicleLabel } from '../services/inspections'
import type { InspectionFinding } from '../../shared/types/quotes'
import type { QuoteStatus } from '../../shared/utils/quote-states'
import { signedDeclineText } from '../../shared/utils/quote-declines'

const GARAGE = 'Millbrook Motor Works'
const DAY = 86_400_000

const TERMS = [
  'Parts and labour as listed, including tax at the rate shown. Anything else we find is quoted to you before we do it.',
  'Payment is due when you collect the vehicle. If we pass an exchange unit\'s deposit on to you, we refund it once our supplier accepts the old unit.',
  'Your old parts are kept for you to see until the vehicle is collected.',
].join('\n')

interface DemoQuote {
  vehicle: { make: string; model: string; generation: string }
  registration: string
  odometer: string
  owner: { name: string; email: string; phone: string }
  findings: InspectionFinding[]
  lines: (NewLine & { told?: boolean; decision?: 'approved' | 'declined' })[]
  status: QuoteStatus
  /** days ago it was sent (none: a draft) */
  sentDaysAgo?: number
  decidedDaysAgo?: number
  signedName?: string
  message?: string
  /** a second revision made from this one after the owner declined it */
  revisedWith?: NewLine[]
}

const QUOTES: DemoQuote[] = [
  {
    vehicle: { make: 'Veltra', model: 'Pennon', generation: 'Mk1' }, registration: 'NG19 KTV', odometer: '68 412 mi',
    owner: { name: 'Ellis Marrow', email: 'ellis.marrow@owners.test', phone: '07700 900 311' },
    findings: [
      { verdict: 'fail', text: 'Front left disc measures 21.6 mm at its thinnest; the minimum for this disc is 22.0 mm.' },
      { verdict: 'advise', text: 'Front pads have about 3 mm of friction material left.' },
    ],
    status: 'draft',
    lines: [
      { kind: 'part', sku: 'KD-1001', quantity: 2, recommendation: 'required', reason: 'Front discs are under their minimum thickness.' },
      { kind: 'part', sku: 'KP-1001', quantity: 1, recommendation: 'required', reason: 'New discs on the front axle take new pads.' },
      { kind: 'labour', description: 'Replace front discs and pads, bed in and road test', hours: 1.8 },
    ],
  },
  {
    vehicle: { make: 'Veltra', model: 'Pennon', generation: 'Mk2' }, registration: 'RV66 LMB', odometer: '91 030 mi',
    owner: { name: 'Priti Vance', email: 'priti.vance@owners.test', phone: '07700 900 452' },
    findings: [
      { verdict: 'fail', text: 'Front pads are down to 1.5 mm: below the legal minimum.' },
      { verdict: 'advise', text: 'Brake fluid holds 2.5 % water; it is due for a change.' },
    ],
    status: 'sent', sentDaysAgo: 1,
    message: 'We can fit the pads tomorrow morning if you approve today.',
    lines: [
      { kind: 'part', sku: '@front pad_set', quantity: 1, recommendation: 'required', reason: 'Front pads are below the legal minimum.' },
      { kind: 'part', sku: '@fluid', quantity: 1, recommendation: 'advised', reason: 'Fluid has absorbed water.' },
      { kind: 'labour', description: 'Fit front pads', hours: 0.8 },
      { kind: 'labour', description: 'Flush and bleed the brake fluid', hours: 0.7, recommendation: 'advised' },
    ],
  },
  {
    vehicle: { make: 'Veltra', model: 'Skerry', generation: 'Series A' }, registration: 'NG20 PRW', odometer: '44 870 mi',
    owner: { name: 'Tomasz Reed', email: 'tomasz.reed@owners.test', phone: '07700 900 583' },
    findings: [
      { verdict: 'fail', text: 'Front pads are down to 1.8 mm.' },
      { verdict: 'advise', text: 'Rear discs show thickness variation of 0.018 mm; a judder may follow.' },
    ],
    status: 'partly_approved', sentDaysAgo: 6, decidedDaysAgo: 5, signedName: 'Tomasz Reed',
    lines: [
      { kind: 'part', sku: '@front pad_set', quantity: 1, recommendation: 'required', decision: 'approved', reason: 'Front pads are worn out.' },
      { kind: 'part', sku: '@rear disc', quantity: 2, recommendation: 'advised', decision: 'declined', reason: 'Rear discs are uneven.' },
      { kind: 'labour', description: 'Fit front pads', hours: 0.8, decision: 'approved' },
      { kind: 'sundry', description: 'Brake cleaner and copper-free grease', amountMinor: 450, decision: 'approved' },
    ],
  },
  {
    vehicle: { make: 'Veltra', model: 'Pennon', generation: 'Mk1' }, registration: 'NG14 DXA', odometer: '120 554 mi',
    owner: { name: 'Odile Farrant', email: 'odile.farrant@owners.test', phone: '' },
    findings: [{ verdict: 'advise', text: 'Rear pads have about 3 mm left.' }],
    status: 'expired', sentDaysAgo: 40,
    lines: [
      { kind: 'part', sku: '@rear pad_set', quantity: 1, recommendation: 'advised', reason: 'Rear pads are getting thin.' },
      { kind: 'labour', description: 'Fit rear pads', hours: 0.9, recommendation: 'advised' },
    ],
  },
  {
    vehicle: { make: 'Veltra', model: 'Pennon', generation: 'Mk1' }, registration: 'NG17 HBE', odometer: '102 300 mi',
    owner: { name: 'Sunniva Holt', email: 'sunniva.holt@owners.test', phone: '07700 900 664' },
    findings: [{ verdict: 'fail', text: 'Front left caliper piston is seized: the pad on that side is worn unevenly.' }],
    status: 'declined', sentDaysAgo: 3, decidedDaysAgo: 2, signedName: 'S. Holt',
    lines: [
      { kind: 'part', sku: 'KC-1001', quantity: 1, recommendation: 'required', told: true, decision: 'declined', reason: 'Seized caliper piston.' },
      { kind: 'labour', description: 'Replace front left caliper and bleed', hours: 1.2, decision: 'declined' },
    ],
    // after a call: an exchange caliper instead of a new one, so a second revision
    revisedWith: [{ kind: 'part', sku: 'KC-1001R', quantity: 1, recommendation: 'required', reason: 'Seized caliper piston; exchange unit.' }],
  },
]

/** "@front pad_set" -> the first SKU of that type the vehicle's fitment lists on that axle (or anywhere). */
async function skuFor(t: Transaction, vehicleId: number, spec: string): Promise<string> {
  if (!spec.startsWith('@')) return spec
  const [axleOrType, maybeType] = spec.slice(1).split(' ')
  const type = maybeType ?? axleOrType!
  const axle = maybeType ? axleOrType : null
  const [rows] = await Fitment.sequelize!.query(
    `SELECT p.sku FROM fitments f JOIN parts p ON p.id = f.part_id
     WHERE f.vehicle_id = :vehicleId AND p.type = :type AND p.status = 'active' ${axle ? 'AND f.axle = :axle' : ''}
     ORDER BY p.sku LIMIT 1`,
    { replacements: { vehicleId, type, axle }, transaction: t },
  ) as [{ sku: string }[], unknown]
  if (!rows[0]) throw new Error(`quotes seed: no ${spec} for vehicle ${vehicleId}`)
  return rows[0].sku
}

export async function seedQuotes(t: Transaction, log: (s: string) => void): Promise<void> {
  const org = await Organisation.findOne({ where: { name: GARAGE, kind: 'garage' }, transaction: t })
  if (!org) throw new Error('quotes seed needs the demo garages (run the accounts seed first)')
  const manager = await User.findOne({ where: { organisationId: org.id, role: 'garage_manager' }, order: [['id', 'ASC']], transaction: t })
  const technician = await User.findOne({ where: { organisationId: org.id, role: 'garage_technician' }, order: [['id', 'ASC']], transaction: t })
  if (!manager || !technician) throw new Error('quotes seed needs Millbrook\'s manager and technician')

  let settingsMade = false
  if (!await GarageSettings.findOne({ where: { organisationId: org.id }, transaction: t })) {
    await GarageSettings.create({
      organisationId: org.id, labourRateMinor: 6800, taxRateBp: 2000, quoteValidityDays: 30, quoteTerms: TERMS,
      markupRules: {
        mode: 'by_type', defaultBp: 3000,
        byType: { pad_set: 4000, disc: 3500, drum: 3500, shoe_set: 4000, caliper: 2500, master_cylinder: 2500, wheel_cylinder: 3000, hose: 4500, fluid: 5000, fitting_kit: 5000 },
      },
    }, { transaction: t })
    settingsMade = true
  }

  if (await Quote.count({ where: { organisationId: org.id }, transaction: t })) {
    log(`quotes: ${GARAGE} settings ${settingsMade ? 'created' : 'kept'}, quotes already there`)
    return
  }

  const now = Date.now()
  let number = 0
  let link = ''
  for (const d of QUOTES) {
    const vehicle = await Vehicle.findOne({ where: d.vehicle, order: [['id', 'ASC']], transaction: t })
    if (!vehicle) throw new Error(`quotes seed: no demo vehicle ${d.vehicle.make} ${d.vehicle.model} ${d.vehicle.generation}`)
    number += 1
    const sentAt = d.sentDaysAgo !== undefined ? new Date(now - d.sentDaysAgo * DAY) : null
    const q = await Quote.create({
      organisationId: org.id, number, status: 'draft', vehicleId: vehicle.id, vehicleLabel: vehicleLabel(vehicle),
      registration: d.registration, odometer: d.odometer, ownerName: d.owner.name, ownerEmail: d.owner.email, ownerPhone: d.owner.phone,
      findings: d.findings, messageToOwner: d.message ?? '', createdByUserId: technician.id,
    }, { transaction: t })
    const decisions = new Map<number, 'approved' | 'declined'>()
    for (const l of d.lines) {
      const { told, decision, ...line } = l
      const sku = line.sku ? await skuFor(t, vehicle.id, line.sku) : undefined
      // the demo car is the one the part was picked for: its fitment's option answers are the car's
      const fit = sku ? await Fitment.findOne({ where: { vehicleId: vehicle.id }, include: [{ model: Part, as: 'part', where: { sku }, attributes: [] }], transaction: t }) : null
      const created = await addLine(t, q, org, { ...line, sku, quantity: line.quantity ?? 1, answers: fit?.qualifiers ?? {} })
      if (told) await changeLine(t, created[0]!, { toldOwnerDeclinedRequired: true }, manager.id)
      if (decision) decisions.set(created[0]!.id, decision)
    }
    if (sentAt) {
      const { token, hash } = newQuoteToken()
      await q.update({
        status: d.status, tokenHash: hash, sentAt, sentByUserId: manager.id, expiresAt: new Date(sentAt.getTime() + 30 * DAY),
        decidedAt: d.decidedDaysAgo !== undefined ? new Date(now - d.decidedDaysAgo * DAY) : null,
        decisionIp: d.decidedDaysAgo !== undefined ? '192.0.2.44' : null, signedName: d.signedName ?? null,
      }, { transaction: t })
      const decidedAt = d.decidedDaysAgo !== undefined ? new Date(now - d.decidedDaysAgo * DAY) : null
      for (const l of await linesOf(q.id, t)) {
        if (!isDecidable(l) || !decisions.has(l.id)) continue
        // declining a required line is on record with the owner's signed acknowledgement
        const signed = decisions.get(l.id) === 'declined' && l.recommendation === 'required'
          ? { declineStatement: signedDeclineText(l), declineSignedName: d.signedName ?? d.owner.name, declineSignedAt: decidedAt, declineAddress: '192.0.2.44' }
          : {}
        await QuoteLine.update({ ownerDecision: decisions.get(l.id), ...signed }, { where: { id: l.id }, transaction: t })
      }
      if (d.status === 'sent') link = `/q/${token}`
    }
    if (d.revisedWith) {
      const { quote: rev, lineIds } = await reviseQuote(t, q, manager.id)
      const oldPart = (await linesOf(q.id, t)).find((l) => l.kind === 'part')!
      await QuoteLine.destroy({ where: { id: lineIds.get(oldPart.id)! }, transaction: t })
      for (const l of d.revisedWith) await addLine(t, rev, org, l)
    }
  }
  log(`quotes: ${GARAGE} settings ${settingsMade ? 'created' : 'kept'}, ${QUOTES.length} quotes (one with a second revision)${link ? `; owner's link of the quote with the owner: ${link}` : ''}`)
}

/**
 * Quotes without HTTP: the garage's settings with their defaults, numbering, line pricing (net price captured
 * from the active price version when a part is added, markup from the garage's rules, core deposits for
 * remanufactured units), revisions, expiry, and the shapes the routes answer (shared/types/quotes.ts).
 * Plain Node, so the seed can use it. Totals follow the one rounding rule in shared/utils/quote-totals.ts.
 */
import { createHash, randomBytes } from 'node:crypto'
import { Op, type Transaction } from 'sequelize'
import { Branch, Organisation, User } from '../models/accounts'
import { Part, StockLevel, Supersession, Vehicle } from '../models/catalogue'
import { Inspection } from '../models/inspections'
import { GarageSettings, Quote, QuoteLine } from '../models/quotes'
import { withWrite } from '../utils/db'
import { garagePrices } from './pricing'
import { vehicleLabel } from './inspections'
import { can } from '../../shared/utils/abilities'
import { DEFAULT_MARKUP_RULES, markupBpFor, type MarkupRules } from '../../shared/utils/quote-markup'
import { effectiveQuoteStatus, nextQuoteStatus, quoteEditMode, type QuoteStatus } from '../../shared/utils/quote-states'
import { hoursToHundredths, labourAmountMinor, quoteTotals, sellingUnitMinor, type TotalsLineInput } from '../../shared/utils/quote-totals'
import { divRoundHalfUp } from '../../shared/utils/money'
import { plainFinding } from '../../shared/utils/quote-wording'
import type {
  OwnerQuoteView, QuoteDetail, InspectionFinding, QuoteLineView, QuoteSummary, Recommendation, StockNote,
} from '../../shared/types/quotes'
import type { Role } from '../../shared/types/accounts'
import { DomainError, invalidInput, conflict, isDomainError } from './errors'

// ---------------------------------------------------------------------------------------------------------
// settings

export const DEFAULT_QUOTE_TERMS = [
  'Prices include the parts and labour listed; work not listed is quoted separately before it is done.',
  'Old parts are kept for you to see on request, except units returned to the supplier for their core deposit.',
].join('\n')

export interface EffectiveSettings {
  labourRateMinor: number
  markupRules: MarkupRules
  taxRateBp: number
  quoteValidityDays: number
  quoteTerms: string
  logoFile: string | null
  logoMime: string | null
  logoUpdatedAt: Date | null
}

export const DEFAULT_SETTINGS: EffectiveSettings = {
  labourRateMinor: 0,
  markupRules: DEFAULT_MARKUP_RULES,
  taxRateBp: 2000,
  quoteValidityDays: 30,
  quoteTerms: DEFAULT_QUOTE_TERMS,
  logoFile: null,
  logoMime: null,
  logoUpdatedAt: null,
}

/** The garage's settings, or the defaults while its manager has not saved any (reading never writes). */
export async function settingsOf(organisationId: number, t?: Transaction): Promise<EffectiveSettings> {
  const row = await GarageSettings.findOne({ where: { organisationId }, transaction: t })
  if (!row) return { ...DEFAULT_SETTINGS }
  return {
    labourRateMinor: row.labourRateMinor,
    markupRules: row.markupRules ?? DEFAULT_MARKUP_RULES,
    taxRateBp: row.taxRateBp,
    quoteValidityDays: row.quoteValidityDays,
    quoteTerms: row.quoteTerms ?? '',
    logoFile: row.logoFile ?? null,
    logoMime: row.logoMime ?? null,
    logoUpdatedAt: row.logoUpdatedAt ?? null,
  }
}

/** The settings row, created with the defaults on first save. */
export async function settingsRowFor(t: Transaction, organisationId: number): Promise<GarageSettings> {
  const existing = await GarageSettings.findOne({ where: { organisationId }, transaction: t })
  if (existing) return existing
  return GarageSettings.create({
    organisationId, labourRateMinor: DEFAULT_SETTINGS.labourRateMinor, markupRules: DEFAULT_SETTINGS.markupRules,
    taxRateBp: DEFAULT_SETTINGS.taxRateBp, quoteValidityDays: DEFAULT_SETTINGS.quoteValidityDays, quoteTerms: DEFAULT_SETTINGS.quoteTerms,
  }, { transaction: t })
}

/** Managers see trade prices and markups; technicians only when their garage allows it. */
export function seesTradePrices(role: Role, org: Pick<Organisation, 'techniciansSeePrices'>): boolean {
  return can(role, 'quotes.price') || (role === 'garage_technician' && !!org.techniciansSeePrices)
}

// ---------------------------------------------------------------------------------------------------------
// tokens

/** 32 random bytes (256 bits) for the owner's link; only the SHA-256 is stored. */
export function newQuoteToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashQuoteToken(token) }
}

export function hashQuoteToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

// ---------------------------------------------------------------------------------------------------------
// reading

export function quoteReference(q: Pick<Quote, 'number' | 'revision'>): string {
  return `Q-${String(q.number).padStart(4, '0')}${q.revision > 1 ? ` rev ${q.revision}` : ''}`
}

/** A garage's quote by id, or null when it does not exist or is another garage's. */
export function findQuoteOf(organisationId: number, id: number, t?: Transaction): Promise<Quote | null> {
  return Quote.findOne({ where: { id, organisationId }, transaction: t })
}

export async function linesOf(quoteId: number, t?: Transaction): Promise<QuoteLine[]> {
  const rows = await QuoteLine.findAll({ where: { quoteId }, order: [['position', 'ASC'], ['id', 'ASC']], transaction: t })
  return orderLines(rows)
}

/** Lines by position, each core deposit straight after its part. */
export function orderLines<T extends Pick<QuoteLine, 'id' | 'position' | 'parentLineId'>>(rows: T[]): T[] {
  const top = rows.filter((l) => !l.parentLineId || !rows.some((p) => p.id === l.parentLineId))
    .sort((a, b) => a.position - b.position || a.id - b.id)
  const out: T[] = []
  for (const l of top) {
    out.push(l)
    for (const c of rows.filter((x) => x.parentLineId === l.id).sort((a, b) => a.id - b.id)) out.push(c)
  }
  return out
}

/** Sent quotes past their validity become expired (one guarded UPDATE; nothing written when none are due). */
export async function expireDueQuotes(where: { organisationId?: number; id?: number } = {}, now = new Date()): Promise<number> {
  const due = { status: 'sent', expiresAt: { [Op.lte]: now }, ...where }
  const count = await Quote.count({ where: due })
  if (!count) return 0
  return withWrite(async (t) => {
    const [n] = await Quote.update({ status: 'expired' }, { where: due, transaction: t })
    return n
  })
}

/** Which lines the owner chooses: parts, labour and sundries (core deposits follow their part; discounts apply). */
export function isDecidable(line: Pick<QuoteLine, 'kind'>): boolean {
  return line.kind === 'part' || line.kind === 'labour' || line.kind === 'sundry'
}

/** Whether a line counts in the approved totals, given the owner's decisions. */
function approvedIncluded(line: QuoteLine, all: QuoteLine[]): boolean {
  if (line.kind === 'discount') return true
  if (line.kind === 'core_deposit') return all.find((p) => p.id === line.parentLineId)?.ownerDecision === 'approved'
  return line.ownerDecision === 'approved'
}

export function totalsInput(lines: QuoteLine[], mode: 'quoted' | 'approved'): TotalsLineInput[] {
  return lines.map((l) => ({
    id: l.id, kind: l.kind, amountMinor: l.amountMinor, taxBp: l.taxBp,
    included: mode === 'quoted' ? true : approvedIncluded(l, lines),
  }))
}

const DECIDED: QuoteStatus[] = ['approved', 'partly_approved', 'declined']
const iso = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString() : null)

export function hoursOf(line: Pick<QuoteLine, 'hoursHundredths'>): number | null {
  return line.hoursHundredths == null ? null : line.hoursHundredths / 100
}

/** Stock of the quote's parts at the garage's home branch, and elsewhere when that is short. */
export async function stockNotes(lines: QuoteLine[], org: Pick<Organisation, 'homeBranchId'>, t?: Transaction): Promise<Map<number, StockNote>> {
  const out = new Map<number, StockNote>()
  const partLines = lines.filter((l) => l.kind === 'part' && l.partId)
  if (!partLines.length) return out
  const partIds = [...new Set(partLines.map((l) => l.partId!))]
  const [levels, branches] = await Promise.all([
    StockLevel.findAll({ where: { partId: { [Op.in]: partIds } }, transaction: t }),
    Branch.findAll({ order: [['id', 'ASC']], transaction: t }),
  ])
  const home = branches.find((b) => b.id === org.homeBranchId) ?? branches[0]
  if (!home) return out
  const needed = new Map<number, number>()
  for (const l of partLines) needed.set(l.partId!, (needed.get(l.partId!) ?? 0) + l.quantity)
  const qty = (partId: number, branchId: number) => levels.find((s) => s.partId === partId && s.branchId === branchId)?.quantity ?? 0
  for (const l of partLines) {
    const need = needed.get(l.partId!)!
    const atHome = qty(l.partId!, home.id)
    const short = atHome < need
    out.set(l.id, {
      branchCode: home.code, branchName: home.name, quantity: atHome, short,
      elsewhere: short
        ? branches.filter((b) => b.id !== home.id && qty(l.partId!, b.id) >= need)
          .map((b) => ({ branchCode: b.code, branchName: b.name, quantity: qty(l.partId!, b.id) }))
        : [],
    })
  }
  return out
}

export function lineView(l: QuoteLine, showTrade: boolean, stock: StockNote | null, taxMinor: number): QuoteLineView {
  return {
    id: l.id, position: l.position, kind: l.kind, partId: l.partId ?? null, sku: l.sku ?? null, partType: l.partType ?? null,
    description: l.description, quantity: l.quantity, hours: hoursOf(l), rateMinor: l.rateMinor ?? null,
    unitNetMinor: showTrade ? (l.unitNetMinor ?? null) : null,
    markupBp: showTrade ? (l.markupBp ?? null) : null,
    unitPriceMinor: l.unitPriceMinor, amountMinor: l.amountMinor, taxBp: l.taxBp, taxMinor,
    recommendation: l.recommendation ?? null, reason: l.reason ?? null, coreCharge: l.coreCharge ?? null,
    parentLineId: l.parentLineId ?? null, ownerDecision: l.ownerDecision ?? null,
    toldOwnerDeclinedRequired: !!l.toldOwnerDeclinedRequired, stock,
  }
}

export function quoteSummary(q: Quote, grossMinor: number): QuoteSummary {
  return {
    id: q.id, reference: quoteReference(q), number: q.number, revision: q.revision,
    status: effectiveQuoteStatus(q.status, q.expiresAt ?? null),
    vehicle: q.vehicleLabel || (q.vehicle ? vehicleLabel(q.vehicle) : ''),
    registration: q.registration ?? '', ownerName: q.ownerName, grossMinor,
    sentAt: iso(q.sentAt), expiresAt: iso(q.expiresAt), decidedAt: iso(q.decidedAt),
    createdAt: iso(q.createdAt)!, updatedAt: iso(q.updatedAt)!,
  }
}

export interface Viewer { role: Role; org: Organisation }

/** The full quote for the garage's own people. */
export async function quoteDetail(q: Quote, viewer: Viewer, currency: string, t?: Transaction): Promise<QuoteDetail> {
  const lines = await linesOf(q.id, t)
  const showTrade = seesTradePrices(viewer.role, viewer.org)
  const quoted = quoteTotals(totalsInput(lines, 'quoted'))
  const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
  const approved = DECIDED.includes(status) ? quoteTotals(totalsInput(lines, 'approved')) : null
  const [stock, revisions, successor, author] = await Promise.all([
    stockNotes(lines, viewer.org, t),
    Quote.findAll({ where: { organisationId: q.organisationId, number: q.number }, attributes: ['id', 'revision', 'status', 'expiresAt', 'createdAt'], order: [['revision', 'ASC']], transaction: t }),
    Quote.findOne({ where: { supersedesQuoteId: q.id }, attributes: ['id'], transaction: t }),
    User.findByPk(q.createdByUserId, { attributes: ['id', 'name'], transaction: t }),
  ])
  const taxOf = new Map(quoted.lines.map((l) => [l.id, l.taxMinor]))
  const warnings: string[] = []
  for (const l of lines) {
    const s = stock.get(l.id)
    if (s?.short) {
      const alt = s.elsewhere.map((e) => `${e.branchName} has ${e.quantity}`).join(', ')
      warnings.push(`${l.sku}: ${s.quantity} on the shelf at ${s.branchName}, the quote needs ${l.quantity}${alt ? ` (${alt})` : ' and no branch has enough'}.`)
    }
    if (l.kind === 'labour' && !l.rateMinor) warnings.push(`"${l.description}" has no labour rate: set one in the garage settings or on the line.`)
    if (l.kind === 'sundry' && !l.amountMinor) warnings.push(`"${l.description}" has no price yet.`)
  }
  if (quoted.discountCapped) warnings.push('The discounts are larger than the rest of the quote; only part of them counts.')
  return {
    ...quoteSummary(q, quoted.grossMinor),
    status,
    vehicleId: q.vehicleId ?? null,
    odometer: q.odometer ?? '',
    ownerEmail: q.ownerEmail,
    ownerPhone: q.ownerPhone ?? '',
    inspectionId: q.inspectionId ?? null,
    findings: q.findings ?? [],
    messageToOwner: q.messageToOwner ?? '',
    supersedesQuoteId: q.supersedesQuoteId ?? null,
    supersededByQuoteId: successor?.id ?? null,
    decisionIp: q.decisionIp ?? null,
    signedName: q.signedName ?? null,
    createdBy: author?.name ?? '',
    lines: lines.map((l) => lineView(l, showTrade, stock.get(l.id) ?? null, taxOf.get(l.id) ?? 0)),
    totals: { netMinor: quoted.netMinor, taxMinor: quoted.taxMinor, grossMinor: quoted.grossMinor },
    approvedTotals: approved ? { netMinor: approved.netMinor, taxMinor: approved.taxMinor, grossMinor: approved.grossMinor } : null,
    taxByRate: quoted.byRate,
    revisions: revisions.map((r) => ({ id: r.id, revision: r.revision, status: effectiveQuoteStatus(r.status, r.expiresAt ?? null), createdAt: iso(r.createdAt)! })),
    currency,
    showsTradePrices: showTrade,
    warnings,
  }
}

/** What the owner sees through the link: this quote and the garage's name and contact, nothing else. */
export async function ownerView(q: Quote, currency: string, t?: Transaction): Promise<OwnerQuoteView> {
  const [lines, org, settings] = await Promise.all([
    linesOf(q.id, t),
    Organisation.findByPk(q.organisationId, { attributes: ['id', 'name', 'phone', 'email'], transaction: t }),
    settingsOf(q.organisationId, t),
  ])
  const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
  const quoted = quoteTotals(totalsInput(lines, 'quoted'))
  const approved = DECIDED.includes(status) ? quoteTotals(totalsInput(lines, 'approved')) : null
  const taxOf = new Map(quoted.lines.map((l) => [l.id, l.taxMinor]))
  const rates = [...new Set(lines.map((l) => l.taxBp))]
  return {
    state: status === 'superseded' ? 'superseded' : DECIDED.includes(status) ? 'decided' : 'open',
    garage: { name: org?.name ?? '', phone: org?.phone ?? '', email: org?.email ?? '', hasLogo: !!settings.logoFile },
    reference: quoteReference(q),
    status,
    vehicle: q.vehicleLabel ?? '',
    registration: q.registration ?? '',
    odometer: q.odometer ?? '',
    ownerName: q.ownerName,
    sentAt: iso(q.sentAt), expiresAt: iso(q.expiresAt), decidedAt: iso(q.decidedAt), signedName: q.signedName ?? null,
    findings: q.findings ?? [],
    messageToOwner: q.messageToOwner ?? '',
    terms: settings.quoteTerms,
    lines: lines.map((l) => ({
      id: l.id, kind: l.kind, description: l.description, quantity: l.quantity, hours: hoursOf(l),
      unitPriceMinor: l.unitPriceMinor, amountMinor: l.amountMinor, taxBp: l.taxBp, taxMinor: taxOf.get(l.id) ?? 0,
      recommendation: l.recommendation ?? null, reason: l.reason ?? null, coreCharge: l.coreCharge ?? null,
      parentLineId: l.parentLineId ?? null,
      decidable: isDecidable(l),
      declinable: isDecidable(l) && !(l.recommendation === 'required' && !l.toldOwnerDeclinedRequired),
      ownerDecision: l.ownerDecision ?? null,
    })),
    totals: { netMinor: quoted.netMinor, taxMinor: quoted.taxMinor, grossMinor: quoted.grossMinor },
    approvedTotals: approved ? { netMinor: approved.netMinor, taxMinor: approved.taxMinor, grossMinor: approved.grossMinor } : null,
    currency,
    taxLabel: rates.length === 1 ? `Tax at ${rates[0]! / 100} %` : 'Tax',
  }
}

// ---------------------------------------------------------------------------------------------------------
// writing (all inside the caller's withWrite transaction)

/** 422 whose summary is the first field's message (the quote page shows it above the lines). */
function refusedInput(fields: Record<string, string>): DomainError {
  return invalidInput(fields, Object.values(fields)[0])
}

export async function nextQuoteNumber(t: Transaction, organisationId: number): Promise<number> {
  const max = await Quote.max<number, Quote>('number', { where: { organisationId }, transaction: t })
  return (Number(max) || 0) + 1
}

export async function vehicleSnapshot(vehicleId: number, t?: Transaction): Promise<{ id: number; label: string } | null> {
  const v = await Vehicle.findByPk(vehicleId, { attributes: ['id', 'make', 'model', 'generation', 'yearFrom', 'yearTo'], transaction: t })
  return v ? { id: v.id, label: vehicleLabel(v) } : null
}

/** The inspection's findings in plain words: every check that is not ok, worst first. */
export function findingsOf(inspection: Pick<Inspection, 'result'>): InspectionFinding[] {
  const items = inspection.result?.items ?? []
  return items.filter((i) => i.verdict !== 'ok')
    .map((i) => ({ verdict: i.verdict as 'advise' | 'fail', text: plainFinding(i) }))
    .sort((a, b) => (a.verdict === b.verdict ? 0 : a.verdict === 'fail' ? -1 : 1))
}

async function nextPosition(t: Transaction, quoteId: number): Promise<number> {
  const max = await QuoteLine.max<number, QuoteLine>('position', { where: { quoteId }, transaction: t })
  return (Number(max) || 0) + 1
}

/** Works out a line's unit price and amount from what is stored (rule 1 of quote-totals). */
export function repriceLine(l: QuoteLine): void {
  switch (l.kind) {
    case 'part':
      l.amountMinor = l.unitPriceMinor * l.quantity
      break
    case 'core_deposit':
      l.unitPriceMinor = l.unitNetMinor ?? 0
      l.amountMinor = l.coreCharge === 'absorbed' ? 0 : l.unitPriceMinor * l.quantity
      break
    case 'labour':
      l.quantity = 1
      l.unitPriceMinor = l.rateMinor ?? 0
      l.amountMinor = labourAmountMinor(l.hoursHundredths ?? 0, l.rateMinor ?? 0)
      break
    case 'sundry':
      l.amountMinor = l.unitPriceMinor * l.quantity
      break
    case 'discount':
      l.quantity = 1
      l.amountMinor = l.unitPriceMinor
      break
  }
}

export interface PartResolution { part: Part; unitNetMinor: number; coreDepositMinor: number; replacedSku: string | null }

/** The part for a SKU (following a supersession to its replacement) and the garage's current net price. */
export async function resolvePart(t: Transaction, org: Organisation, sku: string): Promise<PartResolution> {
  const wanted = sku.trim()
  let part = await Part.findOne({ where: { sku: wanted }, transaction: t })
    ?? await Part.findOne({ where: { sku: wanted.toUpperCase() }, transaction: t })
  let replacedSku: string | null = null
  if (!part) {
    const sup = await Supersession.findOne({ where: { oldSku: { [Op.in]: [wanted, wanted.toUpperCase()] } }, transaction: t })
    if (sup) {
      part = await Part.findByPk(sup.newPartId, { transaction: t })
      replacedSku = sup.oldSku
    }
  }
  if (!part) throw refusedInput({ sku: `No part with SKU "${wanted}" in the catalogue.` })
  if (part.status === 'discontinued') throw refusedInput({ sku: `${part.sku} is discontinued.` })
  const prices = await garagePrices(org, [part.sku], t)
  const price = prices.get(part.sku)
  if (!price) throw refusedInput({ sku: `${part.sku} has no price on the prices in use.` })
  return { part, unitNetMinor: price.unitNetMinor, coreDepositMinor: price.coreDepositMinor, replacedSku }
}

export interface NewLine {
  kind: 'part' | 'labour' | 'sundry' | 'discount'
  sku?: string
  quantity?: number
  description?: string
  hours?: number
  amountMinor?: number
  recommendation?: Recommendation | null
  reason?: string | null
  markupBp?: number
  rateMinor?: number
  taxBp?: number
}

/** Adds one line (and a core-deposit line for a remanufactured part). Returns the lines created. */
export async function addLine(t: Transaction, q: Quote, org: Organisation, input: NewLine): Promise<QuoteLine[]> {
  const settings = await settingsOf(org.id, t)
  const position = await nextPosition(t, q.id)
  const taxBp = input.taxBp ?? settings.taxRateBp
  const base = { quoteId: q.id, position, taxBp, recommendation: input.recommendation ?? null, reason: input.reason ?? null }
  const created: QuoteLine[] = []
  if (input.kind === 'part') {
    const r = await resolvePart(t, org, input.sku!)
    const markupBp = input.markupBp ?? markupBpFor(settings.markupRules, { type: r.part.type, unitNetMinor: r.unitNetMinor })
    const quantity = input.quantity ?? 1
    const unitPriceMinor = sellingUnitMinor(r.unitNetMinor, markupBp)
    const line = QuoteLine.build({
      ...base, kind: 'part', partId: r.part.id, sku: r.part.sku, partType: r.part.type,
      description: input.description || r.part.description, quantity, unitNetMinor: r.unitNetMinor, markupBp, unitPriceMinor,
    })
    repriceLine(line)
    await line.save({ transaction: t })
    created.push(line)
    if (r.coreDepositMinor > 0) {
      const core = QuoteLine.build({
        quoteId: q.id, position, taxBp, kind: 'core_deposit', parentLineId: line.id, partId: r.part.id, sku: r.part.sku,
        partType: r.part.type, description: `Core deposit for ${r.part.sku} (refunded when the old unit goes back)`,
        quantity, unitNetMinor: r.coreDepositMinor, coreCharge: 'charged',
      })
      repriceLine(core)
      await core.save({ transaction: t })
      created.push(core)
    }
    return created
  }
  if (input.kind === 'labour') {
    const line = QuoteLine.build({
      ...base, kind: 'labour', description: input.description || 'Labour',
      hoursHundredths: hoursToHundredths(input.hours!)!, rateMinor: input.rateMinor ?? settings.labourRateMinor,
    })
    repriceLine(line)
    await line.save({ transaction: t })
    return [line]
  }
  if (input.kind === 'sundry') {
    const line = QuoteLine.build({
      ...base, kind: 'sundry', description: input.description!, quantity: input.quantity ?? 1, unitPriceMinor: input.amountMinor ?? 0,
    })
    repriceLine(line)
    await line.save({ transaction: t })
    return [line]
  }
  const line = QuoteLine.build({
    ...base, kind: 'discount', recommendation: null, description: input.description || 'Discount', unitPriceMinor: -(input.amountMinor ?? 0),
  })
  repriceLine(line)
  await line.save({ transaction: t })
  return [line]
}

/** Refuses discounts larger than the rest of the quote (checked after every change to a line). */
export async function assertDiscountsFit(t: Transaction, quoteId: number): Promise<void> {
  const lines = await linesOf(quoteId, t)
  if (quoteTotals(totalsInput(lines, 'quoted')).discountCapped) {
    throw refusedInput({ amountMinor: 'The discounts would be larger than the rest of the quote.' })
  }
}

export interface LineChange {
  quantity?: number
  description?: string
  hours?: number
  amountMinor?: number
  recommendation?: Recommendation | null
  unitPriceMinor?: number
  markupBp?: number
  rateMinor?: number
  taxBp?: number
  coreCharge?: 'charged' | 'absorbed'
  toldOwnerDeclinedRequired?: boolean
  position?: number
}

const FIELDS_BY_KIND: Record<QuoteLine['kind'], (keyof LineChange)[]> = {
  part: ['quantity', 'description', 'recommendation', 'unitPriceMinor', 'markupBp', 'taxBp', 'toldOwnerDeclinedRequired', 'position'],
  core_deposit: ['coreCharge', 'taxBp'],
  labour: ['description', 'hours', 'rateMinor', 'recommendation', 'taxBp', 'toldOwnerDeclinedRequired', 'position'],
  sundry: ['quantity', 'description', 'amountMinor', 'recommendation', 'taxBp', 'toldOwnerDeclinedRequired', 'position'],
  discount: ['description', 'amountMinor', 'taxBp', 'position'],
}

/** Applies a change to one line (its core deposit follows a part's quantity). */
export async function changeLine(t: Transaction, line: QuoteLine, change: LineChange, actorUserId: number): Promise<void> {
  const allowed = FIELDS_BY_KIND[line.kind]
  const refused = Object.keys(change).filter((k) => change[k as keyof LineChange] !== undefined && !allowed.includes(k as keyof LineChange))
  if (refused.length) {
    throw refusedInput(Object.fromEntries(refused.map((k) => [k, `A ${line.kind.replace('_', ' ')} line has no ${k}.`])))
  }
  if (change.quantity !== undefined) line.quantity = change.quantity
  if (change.description !== undefined) line.description = change.description
  if (change.hours !== undefined) line.hoursHundredths = hoursToHundredths(change.hours)
  if (change.recommendation !== undefined) line.recommendation = change.recommendation
  if (change.taxBp !== undefined) line.taxBp = change.taxBp
  if (change.position !== undefined) line.position = change.position
  if (change.rateMinor !== undefined) line.rateMinor = change.rateMinor
  if (change.coreCharge !== undefined) line.coreCharge = change.coreCharge
  if (change.amountMinor !== undefined) line.unitPriceMinor = line.kind === 'discount' ? -change.amountMinor : change.amountMinor
  if (line.kind === 'discount' && change.amountMinor === 0) throw refusedInput({ amountMinor: 'A discount is more than 0.' })
  if (change.markupBp !== undefined) {
    line.markupBp = change.markupBp
    line.unitPriceMinor = sellingUnitMinor(line.unitNetMinor ?? 0, change.markupBp)
  }
  if (change.unitPriceMinor !== undefined) {
    line.unitPriceMinor = change.unitPriceMinor
    // the markup this price amounts to, for the manager's eye (the price itself is what counts)
    line.markupBp = line.unitNetMinor ? divRoundHalfUp((change.unitPriceMinor - line.unitNetMinor) * 10_000, line.unitNetMinor) : null
  }
  if (change.toldOwnerDeclinedRequired !== undefined) {
    line.toldOwnerDeclinedRequired = change.toldOwnerDeclinedRequired
    line.toldOwnerRecordedByUserId = change.toldOwnerDeclinedRequired ? actorUserId : null
    line.toldOwnerRecordedAt = change.toldOwnerDeclinedRequired ? new Date() : null
  }
  repriceLine(line)
  await line.save({ transaction: t })
  if (line.kind === 'part' && change.quantity !== undefined) {
    const cores = await QuoteLine.findAll({ where: { parentLineId: line.id, kind: 'core_deposit' }, transaction: t })
    for (const c of cores) {
      c.quantity = line.quantity
      repriceLine(c)
      await c.save({ transaction: t })
    }
  }
}

/**
 * A new draft revision of a quote that has left draft (same number, revision + 1, lines copied without the
 * owner's decisions); the old one becomes superseded and its link stops offering a choice.
 * Returns the new quote and old line id -> new line id.
 */
export async function reviseQuote(t: Transaction, old: Quote, actorUserId: number): Promise<{ quote: Quote; lineIds: Map<number, number> }> {
  const status = effectiveQuoteStatus(old.status, old.expiresAt ?? null)
  if (nextQuoteStatus(status, 'supersede') !== 'superseded') {
    throw conflict(status === 'superseded'
      ? 'This revision has been replaced: change the latest one.'
      : 'A draft is changed as it is; it needs no new revision.')
  }
  const [changed] = await Quote.update({ status: 'superseded' }, { where: { id: old.id, status: old.status }, transaction: t })
  if (changed !== 1) throw conflict('The quote changed meanwhile. Reload it and try again.')
  const quote = await Quote.create({
    organisationId: old.organisationId, number: old.number, revision: old.revision + 1, supersedesQuoteId: old.id,
    status: 'draft', vehicleId: old.vehicleId, vehicleLabel: old.vehicleLabel, registration: old.registration, odometer: old.odometer,
    ownerName: old.ownerName, ownerEmail: old.ownerEmail, ownerPhone: old.ownerPhone, inspectionId: old.inspectionId,
    findings: old.findings, messageToOwner: old.messageToOwner, createdByUserId: actorUserId,
  }, { transaction: t })
  const lineIds = new Map<number, number>()
  const lines = await linesOf(old.id, t)
  for (const l of lines) { // parents come before their core deposits
    const copy = await QuoteLine.create({
      quoteId: quote.id, position: l.position, kind: l.kind,
      parentLineId: l.parentLineId ? (lineIds.get(l.parentLineId) ?? null) : null,
      partId: l.partId, sku: l.sku, partType: l.partType, description: l.description, quantity: l.quantity,
      hoursHundredths: l.hoursHundredths, rateMinor: l.rateMinor, unitNetMinor: l.unitNetMinor, markupBp: l.markupBp,
      unitPriceMinor: l.unitPriceMinor, amountMinor: l.amountMinor, taxBp: l.taxBp, recommendation: l.recommendation,
      reason: l.reason, coreCharge: l.coreCharge, ownerDecision: null,
      toldOwnerDeclinedRequired: l.toldOwnerDeclinedRequired, toldOwnerRecordedByUserId: l.toldOwnerRecordedByUserId,
      toldOwnerRecordedAt: l.toldOwnerRecordedAt,
    }, { transaction: t })
    lineIds.set(l.id, copy.id)
  }
  return { quote, lineIds }
}

/**
 * The quote a change applies to: the draft itself, or a new revision of a quote that has left draft.
 * Expired quotes are marked so first. Superseded ones cannot change (the latest revision can).
 */
export async function editableQuote(t: Transaction, q: Quote, actorUserId: number): Promise<{ quote: Quote; lineIds: Map<number, number> | null }> {
  const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
  if (status !== q.status) {
    await Quote.update({ status }, { where: { id: q.id }, transaction: t })
    q.status = status
  }
  const mode = quoteEditMode(status)
  if (mode === 'in_place') return { quote: q, lineIds: null }
  if (mode === 'locked') throw conflict('This revision has been replaced by a newer one: change the latest revision.')
  return reviseQuote(t, q, actorUserId)
}

/** Turns an inspection's recommendations into required (fail) and advised lines; returns what was skipped and why. */
export async function addInspectionLines(
  t: Transaction, q: Quote, org: Organisation, inspection: Inspection, choices: { index: number; sku: string | null }[] = [],
): Promise<{ added: QuoteLine[]; skipped: { index: number; what: string; why: string }[] }> {
  const added: QuoteLine[] = []
  const skipped: { index: number; what: string; why: string }[] = []
  const existing = await linesOf(q.id, t)
  const recs = inspection.recommendedParts ?? []
  // the owner reads the reasons: in plain words where the check has them
  const plain = new Map((inspection.result?.items ?? []).map((i) => [i.message, plainFinding(i)]))
  for (const [index, rec] of recs.entries()) {
    const what = `${rec.axle === 'system' ? 'Brake system' : `${rec.axle[0]!.toUpperCase()}${rec.axle.slice(1)} axle`}: ${rec.partType.replace('-', ' ')}`
    const choice = choices.find((c) => c.index === index)
    if (choice && choice.sku === null) { skipped.push({ index, what, why: 'left out by choice' }); continue }
    const pick = choice?.sku
      ? rec.parts.find((p) => p.sku === choice.sku) ?? { sku: choice.sku, quantity: 1, condition: null }
      : rec.parts.find((p) => p.condition === null) ?? rec.parts[0]
    if (!pick) { skipped.push({ index, what, why: 'no catalogue part fits this vehicle' }); continue }
    if (existing.some((l) => l.kind === 'part' && l.sku === pick.sku) || added.some((l) => l.sku === pick.sku)) {
      skipped.push({ index, what, why: `${pick.sku} is already on the quote` })
      continue
    }
    try {
      const lines = await addLine(t, q, org, {
        kind: 'part', sku: pick.sku, quantity: Math.max(1, pick.quantity ?? 1),
        recommendation: rec.verdict === 'fail' ? 'required' : 'advised',
        reason: [...new Set(rec.reasons.map((r) => plain.get(r) ?? r))].join(' '),
      })
      added.push(...lines)
    } catch (err) {
      if (isDomainError(err) && err.kind === 'invalid') { skipped.push({ index, what, why: Object.values(err.fields)[0] ?? err.message }); continue }
      throw err
    }
  }
  return { added, skipped }
}

/** Offered lines the decision must cover, and a check of the owner's choices. */
export function checkDecision(
  lines: QuoteLine[], choices: { id: number; approved: boolean }[],
): { ok: true; approved: Set<number> } | { ok: false; fields: Record<string, string>; message: string } {
  const offered = new Map(lines.filter(isDecidable).map((l) => [l.id, l]))
  const fields: Record<string, string> = {}
  const seen = new Set<number>()
  choices.forEach((c, i) => {
    const line = offered.get(c.id)
    if (!line) { fields[`lines.${i}.id`] = `Line ${c.id} was not offered for a choice on this quote.`; return }
    if (seen.has(c.id)) { fields[`lines.${i}.id`] = `"${line.description}" is chosen twice.`; return }
    seen.add(c.id)
    if (!c.approved && line.recommendation === 'required' && !line.toldOwnerDeclinedRequired) {
      fields[`lines.${i}.approved`] = `"${line.description}" is needed for the brakes to be safe and cannot be declined here. Please call the garage to talk it through.`
    }
  })
  const missing = [...offered.values()].filter((l) => !seen.has(l.id))
  if (missing.length) fields.lines = `Approve or decline every line (still open: ${missing.map((l) => `"${l.description}"`).join(', ')}).`
  if (Object.keys(fields).length) {
    const required = Object.entries(fields).find(([k]) => k.endsWith('.approved'))
    return { ok: false, fields, message: required ? required[1] : Object.values(fields)[0]! }
  }
  return { ok: true, approved: new Set(choices.filter((c) => c.approved).map((c) => c.id)) }
}

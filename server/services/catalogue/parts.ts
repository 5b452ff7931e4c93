/**
 * The part list (search + filters + paging) and the part page. Plain Node.
 */
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import { pageOfList } from '../../utils/page'
import { Part, PartOeNumber, Supersession } from '../../models/catalogue'
import type { PartListQuery } from '../../../shared/schemas/catalogue/list-query'
import { PART_TYPE_LABELS, type PartType } from '../../../shared/schemas/catalogue/part-types'
import { axleOfSpecs } from '../../../shared/schemas/catalogue/specs'
import { FITTING_RULES, sameFitting } from '../../../shared/utils/catalogue/fitting-rules'
import { getPartIndex } from './catalogue-index'
import { planQuery } from './search-plan'
import { priceFields, pricesFor, stockFor, type PricingContext } from './pricing'
import { engineLabel, vehicleLabel } from './vehicles'

export const MAX_VEHICLES_ON_PART = 500
export const MAX_ALTERNATIVES = 20

interface PageRow { id: number; sku: string; type: PartType; description: string; productLine: string; status: string; specs: string }

/** Description, product line and specs of the parts on one page (the index keeps only compact columns). */
async function pageRows(ids: number[]): Promise<Map<number, PageRow>> {
  if (!ids.length) return new Map()
  const rows = await getDb().query<PageRow>(
    'SELECT id, sku, type, description, product_line AS productLine, status, specs FROM parts WHERE id IN (:ids)',
    { type: QueryTypes.SELECT, replacements: { ids } },
  )
  return new Map(rows.map((r) => [r.id, r]))
}

/**
 * GET /api/parts: one `Page` of the hits, ranked when there is a query, by SKU otherwise; `meta` also says which
 * price version the prices come from and how the query was read.
 */
export async function searchParts(query: PartListQuery, pricing: PricingContext) {
  const index = await getPartIndex(pricing.revision.catalogue)
  const plan = planQuery(query.q ?? '')
  const { hits, types } = index.search(plan, { type: query.type, axle: query.axle, ranges: query.ranges })
  const { data: page, meta } = pageOfList(query, hits)
  const ids = page.map((h) => h.id)
  const oeIds = page.filter((h) => h.by === 'oe' || h.by === 'similar').map((h) => h.id)
  const [rows, prices, stock, oe] = await Promise.all([
    pageRows(ids), pricesFor(pricing.priceVersion?.id, ids), stockFor(ids),
    oeIds.length ? getDb().query<{ partId: number; oeNumber: string; oeNormalised: string }>(
      'SELECT part_id AS partId, oe_number AS oeNumber, oe_normalised AS oeNormalised FROM part_oe_numbers WHERE part_id IN (:ids)',
      { type: QueryTypes.SELECT, replacements: { ids: oeIds } }) : [],
  ])
  const data = page.flatMap((h) => {
    const p = rows.get(h.id)
    if (!p) return [] // removed since the search ran
    const st = stock.get(h.id) ?? []
    const specs = safeJson(p.specs) as Record<string, unknown>
    const printedOe = oe.find((o) => o.partId === h.id && o.oeNormalised.toLowerCase() === h.identifier)?.oeNumber
    return [{
      sku: p.sku, type: p.type, typeLabel: PART_TYPE_LABELS[p.type]?.one ?? p.type, description: p.description, productLine: p.productLine,
      status: p.status, axle: axleOfSpecs(p.type, specs), specs,
      stock: st.map((s) => ({ branchCode: s.branchCode, quantity: s.quantity })), stockTotal: st.reduce((n, s) => n + s.quantity, 0),
      ...priceFields(pricing.view, prices.get(h.id)),
      match: {
        by: h.by,
        ...(h.by === 'superseded' ? { replaces: { sku: h.oldSku, note: h.note } } : {}),
        ...(printedOe ? { oeNumber: printedOe } : {}),
      },
    }]
  })
  return {
    data,
    meta: {
      ...meta,
      priceVersion: pricing.view.kind === 'none' ? null : pricing.priceVersion?.version ?? null,
      // how the query was read, so the page can say "front discs 300 mm"
      understood: {
        types: plan.types && !query.type ? types : null, axle: plan.axle, attributes: plan.attributes,
        numbers: plan.numbers.map((n) => ({ value: Number(n.value.toFixed(3)), dims: n.dims })), ignored: plan.ignored,
      },
    },
  }
}

/** Active parts with the same fitting dimensions within the stated tolerances. */
async function alternativesOf(partId: number, type: PartType, specs: Record<string, unknown>, revision: number) {
  const index = await getPartIndex(revision)
  const candidates = index.sameFittingKey(partId)
  if (!candidates.length) return []
  const rows = await pageRows(candidates)
  return candidates.map((id) => rows.get(id)).filter((r): r is PageRow => !!r && r.status === 'active')
    .map((r) => ({ ...r, specs: safeJson(r.specs) as Record<string, unknown> }))
    .filter((r) => sameFitting(type, specs, r.specs))
    .slice(0, MAX_ALTERNATIVES)
}

interface FitRow {
  fitmentId: number; vehicleId: number; axle: string; side: string; quantity: number; qualifiers: string; note: string
  make: string; model: string; generation: string; body: string; yearFrom: number; yearTo: number | null
  engineCode: string; engineCc: number | null; fuel: string; powerKw: number | null
}

/** GET /api/parts/:sku. An old SKU that was superseded resolves to its replacement (`resolvedFrom` says so). */
export async function partDetail(sku: string, pricing: PricingContext) {
  let part = await Part.findOne({ where: { sku } })
  let resolvedFrom: { sku: string; note: string } | null = null
  if (!part) {
    const s = await Supersession.findOne({ where: { oldSku: sku } })
    if (s) { part = await Part.findByPk(s.newPartId); resolvedFrom = { sku: s.oldSku, note: s.note } }
  }
  if (!part) return null
  const id = part.id
  const db = getDb()
  const [oe, supersedes, replacedBy, fits, count, stock, prices, alternatives] = await Promise.all([
    PartOeNumber.findAll({ where: { partId: id }, order: [['oeNumber', 'ASC']] }),
    Supersession.findAll({ where: { newPartId: id }, order: [['oldSku', 'ASC']] }),
    Supersession.findOne({ where: { oldSku: part.sku } }),
    db.query<FitRow>(
      `SELECT f.id AS fitmentId, f.vehicle_id AS vehicleId, f.axle, f.side, f.quantity, f.qualifiers, f.note,
              v.make, v.model, v.generation, v.body, v.year_from AS yearFrom, v.year_to AS yearTo, v.engine_code AS engineCode,
              v.engine_cc AS engineCc, v.fuel, v.power_kw AS powerKw
         FROM fitments f JOIN vehicles v ON v.id = f.vehicle_id
        WHERE f.part_id = :id ORDER BY v.make, v.model, v.year_from, v.engine_code, f.axle, f.side LIMIT ${MAX_VEHICLES_ON_PART}`,
      { type: QueryTypes.SELECT, replacements: { id } },
    ),
    db.query<{ n: number }>('SELECT COUNT(DISTINCT vehicle_id) AS n FROM fitments WHERE part_id = :id', { type: QueryTypes.SELECT, replacements: { id } }),
    stockFor([id]),
    pricesFor(pricing.priceVersion?.id, [id]),
    alternativesOf(id, part.type as PartType, part.specs, pricing.revision.catalogue),
  ])
  const replacement = replacedBy ? await Part.findByPk(replacedBy.newPartId, { attributes: ['sku', 'description'] }) : null
  const type = part.type as PartType
  const specs = part.specs
  const altIds = alternatives.map((a) => a.id)
  const [altPrices, altStock] = await Promise.all([pricesFor(pricing.priceVersion?.id, altIds), stockFor(altIds)])
  const st = stock.get(id) ?? []
  return {
    id, sku: part.sku, type, typeLabel: PART_TYPE_LABELS[type]?.one ?? type, productLine: part.productLine, description: part.description,
    status: part.status, axle: axleOfSpecs(type, specs), specs,
    oeNumbers: oe.map((o) => ({ oeNumber: o.oeNumber, maker: o.maker })),
    supersedes: supersedes.map((s) => ({ sku: s.oldSku, note: s.note })),
    replacedBy: replacedBy && replacement ? { sku: replacement.sku, description: replacement.description, note: replacedBy.note } : null,
    resolvedFrom,
    vehicles: fits.map((f) => ({
      vehicleId: f.vehicleId, fitmentId: f.fitmentId, label: vehicleLabel(f), engine: engineLabel(f),
      make: f.make, model: f.model, generation: f.generation, yearFrom: f.yearFrom, yearTo: f.yearTo,
      axle: f.axle, side: f.side, quantity: f.quantity, qualifiers: safeJson(f.qualifiers), note: f.note,
    })),
    vehicleCount: Number(count[0]?.n ?? 0),
    stock: st, stockTotal: st.reduce((n, s) => n + s.quantity, 0),
    priceVersion: pricing.view.kind === 'none' ? null : pricing.priceVersion?.version ?? null,
    ...priceFields(pricing.view, prices.get(id)),
    alternatives: alternatives.map((a) => {
      const s = altStock.get(a.id) ?? []
      return {
        sku: a.sku, type: a.type, productLine: a.productLine, description: a.description, specs: a.specs,
        stockTotal: s.reduce((n, x) => n + x.quantity, 0), ...priceFields(pricing.view, altPrices.get(a.id)),
      }
    }),
    alternativesRule: FITTING_RULES[type],
  }
}

function safeJson(s: string): Record<string, string> {
  try { return JSON.parse(s) as Record<string, string> } catch { return {} }
}

/** Issued documents as the routes answer them (shared/types/documents.ts), and finding one the caller may see. */
import type { Transaction, WhereOptions } from 'sequelize'
import { Organisation } from '../../models/accounts'
import { DocumentLine, IssuedDocument } from '../../models/counter'
import { orderReference } from '../../../shared/types/orders'
import { DOCUMENT_KIND_LABELS, type DocumentDetail, type DocumentSummary, type TaxAnalysisRow } from '../../../shared/types/documents'
import { notFound } from '../errors'
import type { DocumentBody } from './issue'

export function documentSummary(d: IssuedDocument): DocumentSummary {
  return {
    id: d.id, kind: d.kind, kindLabel: DOCUMENT_KIND_LABELS[d.kind], reference: d.reference,
    issuedAt: d.issuedAt.toISOString(), taxPoint: d.taxPoint, orderId: d.orderId, orderReference: orderReference(d.orderId),
    invoice: d.invoice ? { id: d.invoice.id, reference: d.invoice.reference } : null,
    reason: d.reason ?? null, netMinor: d.netMinor, taxMinor: d.taxMinor, totalMinor: d.totalMinor, currency: d.currency,
    ...(d.organisation ? { garage: { id: d.organisation.id, name: d.organisation.name } } : {}),
  }
}

/** Net and tax per rate, as the document states them (the sum of its lines at each rate). */
export function taxAnalysis(lines: readonly Pick<DocumentLine, 'taxBp' | 'netMinor' | 'taxMinor'>[]): TaxAnalysisRow[] {
  const rows = new Map<number, TaxAnalysisRow>()
  for (const l of lines) {
    const r = rows.get(l.taxBp) ?? { taxBp: l.taxBp, netMinor: 0, taxMinor: 0 }
    r.netMinor += l.netMinor
    r.taxMinor += l.taxMinor
    rows.set(l.taxBp, r)
  }
  return [...rows.values()].sort((a, b) => b.taxBp - a.taxBp)
}

export function documentDetail(d: IssuedDocument): DocumentDetail {
  const body = JSON.parse(d.body) as DocumentBody
  const lines = [...(d.lines ?? [])].sort((a, b) => a.position - b.position)
  return {
    ...documentSummary(d),
    seller: body.seller, buyer: body.buyer, notes: body.notes ?? [], garageReference: body.garageReference ?? '', branch: body.branch ?? '',
    lines: lines.map((l) => ({ kind: l.kind, sku: l.sku, description: l.description, quantity: l.quantity, unitMinor: l.unitMinor, netMinor: l.netMinor, taxBp: l.taxBp, taxMinor: l.taxMinor })),
    taxAnalysis: taxAnalysis(lines),
  }
}

export const documentIncludes = (withGarage: boolean) => [
  { model: DocumentLine, as: 'lines' },
  { model: IssuedDocument, as: 'invoice', attributes: ['id', 'reference', 'issuedAt'] },
  ...(withGarage ? [{ model: Organisation, as: 'organisation', attributes: ['id', 'name'] }] : []),
]

/** A document the caller may see: `organisationId` null for distributor staff (any), else the garage's own (404 otherwise). */
export async function findVisibleDocument(id: number, organisationId: number | null, t?: Transaction): Promise<IssuedDocument> {
  const where: WhereOptions<IssuedDocument> = organisationId === null ? { id } : { id, organisationId }
  const d = await IssuedDocument.findOne({ where, include: documentIncludes(organisationId === null), transaction: t })
  if (!d) throw notFound('Document')
  return d
}

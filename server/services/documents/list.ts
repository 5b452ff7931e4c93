/** The document lists, newest first, a page at a time: a garage's own, or every garage's for the distributor. */
import type { WhereOptions } from 'sequelize'
import { Organisation } from '../../models/accounts'
import { IssuedDocument } from '../../models/counter'
import { pageOf } from '../../utils/page'
import type { DocumentListQuery } from '../../../shared/schemas/documents'
import type { DocumentSummary } from '../../../shared/types/documents'
import type { Page } from '../../../shared/types/page'
import { documentSummary } from './views'

export function listDocuments(organisationId: number | null, query: DocumentListQuery): Promise<Page<DocumentSummary>> {
  const where: WhereOptions<IssuedDocument> = {
    ...(organisationId === null ? {} : { organisationId }),
    ...(query.kind ? { kind: query.kind } : {}),
    ...(query.orderId ? { orderId: query.orderId } : {}),
  }
  return pageOf(query, (window) => IssuedDocument.findAndCountAll({
    where,
    include: [
      { model: IssuedDocument, as: 'invoice', attributes: ['id', 'reference'] },
      ...(organisationId === null ? [{ model: Organisation, as: 'organisation', attributes: ['id', 'name'] }] : []),
    ],
    order: [['issuedAt', 'DESC'], ['id', 'DESC']],
    ...window,
  }), (rows) => rows.map(documentSummary))
}

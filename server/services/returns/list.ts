/** The return lists, newest first, a page at a time: a garage's own, and every garage's for the counter (waiting first by default). */
import type { WhereOptions } from 'sequelize'
import { PartReturn } from '../../models/counter'
import { pageOf } from '../../utils/page'
import type { ReturnListQuery } from '../../../shared/schemas/returns'
import type { ReturnView } from '../../../shared/types/returns'
import type { Page } from '../../../shared/types/page'
import { returnIncludes, returnView } from './views'

export function listReturns(organisationId: number | null, query: ReturnListQuery, defaultStatus?: ReturnListQuery['status']): Promise<Page<ReturnView>> {
  const status = query.status ?? defaultStatus
  const where: WhereOptions<PartReturn> = { ...(organisationId === null ? {} : { organisationId }), ...(status ? { status } : {}) }
  return pageOf(query, (window) => PartReturn.findAndCountAll({
    where, include: returnIncludes(organisationId === null), order: [['createdAt', 'DESC'], ['id', 'DESC']], distinct: true, ...window,
  }), (rows) => rows.map(returnView))
}

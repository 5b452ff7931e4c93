/** Old units due back, a page at a time: the garage's own (all but `void` unless asked) and the counter's (booked unless asked). */
import { Op, type WhereOptions } from 'sequelize'
import { Organisation } from '../../models/accounts'
import { CoreReturn, OrderLine } from '../../models/orders'
import { pageOf } from '../../utils/page'
import type { CoreReturnListQuery } from '../../../shared/schemas/orders'
import type { CoreReturnStatus, CoreReturnView } from '../../../shared/types/orders'
import type { Page } from '../../../shared/types/page'
import { coreReturnView } from '../orders/views'

const GARAGE_DEFAULT: CoreReturnStatus[] = ['expected', 'booked', 'accepted', 'rejected']
const COUNTER_DEFAULT: CoreReturnStatus[] = ['booked']

function listPage(query: CoreReturnListQuery, where: WhereOptions<CoreReturn>, withGarage: boolean): Promise<Page<CoreReturnView>> {
  return pageOf(query, (window) => CoreReturn.findAndCountAll({
    where,
    include: [
      { model: OrderLine, as: 'line' },
      ...(withGarage ? [{ model: Organisation, as: 'organisation', attributes: ['id', 'name'] }] : []),
    ],
    order: [['updatedAt', 'DESC'], ['id', 'DESC']],
    ...window,
  }), (rows) => rows.map((r) => coreReturnView(r, r.line, withGarage ? r.organisation?.name : undefined)))
}

const statusIn = (status: CoreReturnStatus | undefined, fallback: CoreReturnStatus[]) => (status ? status : { [Op.in]: fallback })

export function garageCoreReturns(organisationId: number, query: CoreReturnListQuery): Promise<Page<CoreReturnView>> {
  return listPage(query, { organisationId, status: statusIn(query.status, GARAGE_DEFAULT) }, false)
}

export function counterCoreReturns(query: CoreReturnListQuery): Promise<Page<CoreReturnView>> {
  return listPage(query, { status: statusIn(query.status, COUNTER_DEFAULT) }, true)
}

/**
 * GET /api/dashboard/distributor.csv?from=&to= -> the distributor's dashboard as a CSV download (section, item, value,
 * unit). 401; 403 without `dashboard.distributor`; 422 bad days.
 */
import { DashboardQuerySchema } from '#shared/schemas/dashboards'
import { spanOf } from '../../services/dashboards/range'
import { distributorDashboard } from '../../services/dashboards/distributor'
import { distributorCsv } from '../../services/dashboards/csv'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'dashboard.distributor')
  const clock = requestClock(event)
  const d = await distributorDashboard(spanOf(queryWith(event, DashboardQuerySchema), clock), clock, serverFormats())
  return sendDownload(event, distributorCsv(d), { name: `distributor-dashboard-${d.range.from}-${d.range.to}.csv`, type: 'text/csv; charset=utf-8' })
})

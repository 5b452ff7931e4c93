/**
 * GET /api/dashboard/garage.csv?from=&to= -> the caller's garage's dashboard as a CSV download (section, item, value,
 * unit). 401; 403 without `dashboard.garage`; 422 bad days.
 */
import { DashboardQuerySchema } from '#shared/schemas/dashboards'
import { spanOf } from '../../services/dashboards/range'
import { garageDashboard } from '../../services/dashboards/garage'
import { garageCsv } from '../../services/dashboards/csv'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'dashboard.garage')
  const d = await garageDashboard(org.id, spanOf(queryWith(event, DashboardQuerySchema), requestClock(event)), serverFormats())
  return sendDownload(event, garageCsv(d), { name: `garage-dashboard-${d.range.from}-${d.range.to}.csv`, type: 'text/csv; charset=utf-8' })
})

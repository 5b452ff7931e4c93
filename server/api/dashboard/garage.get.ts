/**
 * GET /api/dashboard/garage?from=YYYY-MM-DD&to=YYYY-MM-DD -> GarageDashboard: the caller's own garage only: quotes
 * sent and approved, approval of required and advised lines, advised work declined by kind (top 10), average job,
 * spend with the distributor by month, reminders sent and the work they brought back; local days, both included
 * (default the last 30). 401; 403 without `dashboard.garage` (managers); 422 (`data.fields`) bad days.
 */
import { DashboardQuerySchema } from '#shared/schemas/dashboards'
import { spanOf } from '../../services/dashboards/range'
import { garageDashboard } from '../../services/dashboards/garage'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'dashboard.garage')
  return garageDashboard(org.id, spanOf(queryWith(event, DashboardQuerySchema), requestClock(event)), serverFormats())
})

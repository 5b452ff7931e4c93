/**
 * GET /api/dashboard/distributor?from=YYYY-MM-DD&to=YYYY-MM-DD -> DistributorDashboard: sales per day and per branch,
 * gross margin, first-time fill rate, back-orders open, returns by reason, top parts and garages (top 10), what
 * garages owe by ageing bucket, the last price file's effect; local days, both included (default the last 30).
 * 401; 403 without `dashboard.distributor` (admin and counter staff); 422 (`data.fields`) bad days or over 366 days.
 */
import { DashboardQuerySchema } from '#shared/schemas/dashboards'
import { spanOf } from '../../services/dashboards/range'
import { distributorDashboard } from '../../services/dashboards/distributor'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'dashboard.distributor')
  const clock = requestClock(event)
  return distributorDashboard(spanOf(queryWith(event, DashboardQuerySchema), clock), clock, serverFormats())
})

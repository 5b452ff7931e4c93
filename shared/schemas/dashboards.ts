import { z } from 'zod'
import { DASHBOARD_MAX_DAYS } from '../types/dashboards'

const day = (what: string) => z.preprocess((v) => (v === '' ? undefined : v), z.string({ error: `Enter the ${what} day as YYYY-MM-DD.` })
  .regex(/^\d{4}-\d{2}-\d{2}$/, `Enter the ${what} day as YYYY-MM-DD.`)
  .refine((d) => new Date(`${d}T00:00:00Z`).toISOString().slice(0, 10) === d, 'That date does not exist.').optional())

const dayNumber = (d: string) => Date.parse(`${d}T00:00:00Z`) / 86_400_000

/** GET /api/dashboard/{distributor,garage}?from=&to=: local days, both included; by default the last 30 days. */
export const DashboardQuerySchema = z.object({ from: day('first'), to: day('last') }).superRefine((v, ctx) => {
  if (v.from && v.to && v.from > v.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last day comes before the first.' })
  else if (v.from && v.to && dayNumber(v.to) - dayNumber(v.from) + 1 > DASHBOARD_MAX_DAYS) {
    ctx.addIssue({ code: 'custom', path: ['from'], message: `Choose at most ${DASHBOARD_MAX_DAYS} days.` })
  }
})
export type DashboardQuery = z.infer<typeof DashboardQuerySchema>

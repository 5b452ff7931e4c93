/**
 * Keeps the distributor dashboard's day figures summed in the background: every BORELINE_TRADE_DAYS_SECONDS (default
 * 60; 0 turns it off) the days of the last 400 written since they were kept are summed again
 * (server/services/dashboards/day-figures.ts), so the first look after a price file (every day summed again: a few
 * seconds for a year of 200,000 lines) finds them kept instead of summing a year of order lines while someone waits.
 * A run with nothing written since the last costs one read of the days' stamps.
 */
import { everyFewSeconds } from '../utils/interval-job'
import { serverFormats } from '../utils/format'
import { keepRecentDays } from '../services/dashboards/day-figures'

export default defineNitroPlugin((nitro) => {
  everyFewSeconds(nitro, {
    setting: 'BORELINE_TRADE_DAYS_SECONDS', defaultSeconds: 60, name: 'dashboard days',
    run: () => keepRecentDays(new Date(), serverFormats().timeZone),
    report: () => {},
  })
})

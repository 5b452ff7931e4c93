/**
 * The effect of the last price file: the active price version against the one it replaced, part by part (list
 * price dearer, cheaper, unchanged, new), and the mean change of the parts in both, in basis points. Plain Node.
 */
import { Op } from 'sequelize'
import { PriceVersion } from '../../models/catalogue'
import type { DistributorDashboard } from '../../../shared/types/dashboards'
import { localDate } from '../orders/zoned-time'
import { num, rows } from './range'

export async function lastPriceFileEffect(timeZone: string): Promise<DistributorDashboard['lastPriceFile']> {
  const [active, before] = await PriceVersion.findAll({ where: { activatedAt: { [Op.ne]: null } }, order: [['activatedAt', 'DESC'], ['id', 'DESC']], limit: 2 })
  if (!active?.activatedAt) return null
  const prices = async (v: number) => new Map((await rows<{ part_id: number; list_price_minor: number }>(
    'SELECT part_id, list_price_minor FROM part_prices WHERE price_version_id = :v', { v },
  )).map((r) => [num(r.part_id), num(r.list_price_minor)]))
  const now = await prices(active.id)
  const was = before ? await prices(before.id) : new Map<number, number>()
  let dearer = 0, cheaper = 0, unchanged = 0, added = 0, sumBp = 0, compared = 0
  for (const [part, price] of now) {
    const old = was.get(part)
    if (old === undefined) { added++; continue }
    if (price > old) dearer++
    else if (price < old) cheaper++
    else unchanged++
    if (old > 0) { sumBp += ((price - old) * 10_000) / old; compared++ }
  }
  return {
    label: active.label || `Price version ${active.version}`, activatedOn: localDate(active.activatedAt, timeZone),
    dearer, cheaper, unchanged, added, meanChangeBp: compared ? Math.round(sumBp / compared) : null,
  }
}

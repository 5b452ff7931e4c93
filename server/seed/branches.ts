/**
 * The branches' side of the demo: when each counter is open, how its vans run (departure, cut-off before it, a
 * typical transit), how long a transfer from it takes, and where each stocked part sits on its shelves (a bin
 * per part and branch: aisle by part type, then bay and shelf). Idempotent: runs are found by branch and departure,
 * bins are only added where missing.
 */
import type { Transaction } from 'sequelize'
import { Branch } from '../models/accounts'
import { DeliveryRun } from '../models/counter'
import { getDb } from '../utils/db'

const hm = (h: number, m = 0) => h * 60 + m

const SCHEDULES: Record<string, { opens: number; closes: number; collectionMinutes: number; transferMinutes: number; runs: { departs: number; cutoff: number; transit: number }[] }> = {
  NGT: {
    opens: hm(7, 30), closes: hm(17, 30), collectionMinutes: 15, transferMinutes: 180,
    runs: [{ departs: hm(8, 30), cutoff: 30, transit: 45 }, { departs: hm(11), cutoff: 30, transit: 45 }, { departs: hm(14, 30), cutoff: 30, transit: 45 }, { departs: hm(16, 30), cutoff: 30, transit: 45 }],
  },
  RVS: {
    opens: hm(8), closes: hm(17), collectionMinutes: 20, transferMinutes: 240,
    runs: [{ departs: hm(9), cutoff: 45, transit: 60 }, { departs: hm(13, 30), cutoff: 45, transit: 60 }, { departs: hm(16), cutoff: 45, transit: 60 }],
  },
}

// the aisle a part type lives in; bay and shelf follow from the part, so a bin stays put between seeds
const AISLES: Record<string, string> = {
  pad_set: 'A', disc: 'B', drum: 'C', shoe_set: 'D', caliper: 'E', wheel_cylinder: 'F', hose: 'G', master_cylinder: 'H', fluid: 'J',
}

export async function seedBranches(t: Transaction, log: (s: string) => void): Promise<void> {
  let runs = 0
  for (const [code, s] of Object.entries(SCHEDULES)) {
    const branch = await Branch.findOne({ where: { code }, transaction: t })
    if (!branch) continue
    await branch.update({ counterOpensMinute: s.opens, counterClosesMinute: s.closes, collectionMinutes: s.collectionMinutes, transferMinutes: s.transferMinutes, collection: true }, { transaction: t })
    for (const r of s.runs) {
      const [, made] = await DeliveryRun.findOrCreate({
        where: { branchId: branch.id, departsMinute: r.departs },
        defaults: { branchId: branch.id, departsMinute: r.departs, cutoffMinutes: r.cutoff, transitMinutes: r.transit, weekdays: '12345' },
        transaction: t,
      })
      if (made) runs++
    }
  }
  const aisle = `CASE p.type ${Object.entries(AISLES).map(([type, a]) => `WHEN '${type}' THEN '${a}'`).join(' ')} ELSE 'K' END`
  await getDb().query(
    `INSERT INTO stock_bins (part_id, branch_id, bin)
     SELECT s.part_id, s.branch_id, ${aisle} || '-' || CASE WHEN p.id % 24 < 9 THEN '0' ELSE '' END || (1 + (p.id % 24)) || '-' || (1 + (p.id / 24) % 5)
       FROM stock_levels s JOIN parts p ON p.id = s.part_id
      WHERE true
     ON CONFLICT (part_id, branch_id) DO NOTHING`,
    { transaction: t },
  )
  log(`branches: delivery runs and counter hours (${runs} new runs), bins for stocked parts`)
}

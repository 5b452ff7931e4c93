/**
 * The data of bench/processes.ts, written the same way into whichever database DATABASE_URL names: migrations, the
 * demo seed (unless the database already has people, e.g. after catalogue:synthetic), then `--garages N` approved
 * garages, half on trade account (a credit limit no run reaches) and half on card, each with one manager who signs in
 * with the demo password. Prints one JSON line: the garages, every vehicle id with fitments, and the SKUs of active
 * parts with a price in the active price version and stock at the home branch, for the order mix.
 *
 *   DATABASE_URL=… npx tsx bench/lib/processes-data.ts --garages 40
 */
import { QueryTypes } from 'sequelize'
import { closeDb, getDb, withWrite } from '../../server/utils/db'
import { migrateUp } from '../../server/utils/migrate'
import { initModels } from '../../server/models/index'
import { Branch, Organisation, User } from '../../server/models/accounts'
import { hashPasswordOutsideNitro } from '../../server/services/password'

const DEMO_PASSWORD = 'brake-demo-2026'
const at = process.argv.indexOf('--garages')
const count = at > 0 ? Number(process.argv[at + 1]) : 40

await migrateUp(getDb())
initModels(getDb())
const [people] = await getDb().query<{ n: number }>('SELECT COUNT(*) AS n FROM users', { type: QueryTypes.SELECT })
if (!Number(people!.n)) {
  const { runSeed } = await import('../../server/seed/index')
  await runSeed(() => {})
}
const passwordHash = await hashPasswordOutsideNitro(DEMO_PASSWORD)
const garages = await withWrite(async (t) => {
  const home = await Branch.findOne({ where: { code: 'NGT' }, transaction: t })
  const out: { email: string; terms: 'account' | 'card' }[] = []
  for (let i = 0; i < count; i++) {
    const terms = i % 2 === 0 ? 'account' as const : 'card' as const
    const org = await Organisation.create({
      kind: 'garage', name: `Bench Garage ${i + 1}`, status: 'approved', paymentTerms: terms, paymentDays: terms === 'account' ? 30 : 0,
      creditLimitMinor: terms === 'account' ? 1_000_000_000 : 0, homeBranchId: home!.id, email: `office-${i + 1}@bench-garage.test`,
      tradingAddress: `${i + 1} Bench Row, Northgate`, taxNumber: 'GB 000 0000 02',
    }, { transaction: t })
    const email = `manager-${i + 1}@bench-garage.test`
    await User.create({ organisationId: org.id, email, name: `Bench Manager ${i + 1}`, role: 'garage_manager', passwordHash, status: 'active' }, { transaction: t })
    out.push({ email, terms })
  }
  return out
})
const vehicles = await getDb().query<{ id: number }>('SELECT DISTINCT vehicle_id AS id FROM fitments ORDER BY vehicle_id', { type: QueryTypes.SELECT })
const skus = await getDb().query<{ sku: string }>(
  `SELECT p.sku FROM parts p
     JOIN part_prices pp ON pp.part_id = p.id JOIN price_versions v ON v.id = pp.price_version_id AND v.status = 'active'
     JOIN stock_levels s ON s.part_id = p.id JOIN branches b ON b.id = s.branch_id AND b.code = 'NGT'
    WHERE p.status = 'active' AND s.quantity > 0 ORDER BY p.id LIMIT 200`, { type: QueryTypes.SELECT })
await closeDb()
console.log(JSON.stringify({ garages, vehicles: vehicles.map((v) => Number(v.id)), skus: skus.map((s) => s.sku) }))

/**
 * `npm run db:seed`: the invented demo scenario, idempotent (a second run changes nothing). Each domain adds
 * its seed function here, in dependency order; all of them run in one write transaction.
 */
import { withWrite } from '../utils/db'
import { seedAccounts } from './accounts'
import { seedCatalogue } from './catalogue'
import { seedQuotes } from './quotes'
import { seedProofDocuments } from './proof-documents'
import { seedOrders } from './orders'
import { seedGarageVehicles } from './garage-vehicles'
import { seedBranches } from './branches'
import { seedJobs } from './jobs'

export async function runSeed(log: (s: string) => void = console.log): Promise<void> {
  await withWrite(async (t) => {
    await seedAccounts(t, log)
    await seedCatalogue(t, log)
    await seedBranches(t, log)
    await seedJobs(t, log)
    await seedQuotes(t, log)
    await seedProofDocuments(t, log)
    await seedOrders(t, log)
    await seedGarageVehicles(t, log)
  })
}

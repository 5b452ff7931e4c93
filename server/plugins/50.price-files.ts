/**
 * Price files at start and while running: where uploaded files live, checks interrupted by a restart run
 * again, scheduled versions take effect on time (a sweep every 15 s, plus a timer set when scheduling), and, with
 * `BORELINE_PRICE_SNAPSHOT_AT_START=1`, the catalogue snapshot that checks compare against is built at start. On
 * PostgreSQL the checks are jobs of the shared queue: any process may take one, and its progress is written to the
 * price file's row for every process to show; an apply cut short by a process that stopped is put back to ready by
 * the next sweep of any process.
 */
import { setUploadsRoot } from '../services/price-files/storage'
import { recoverCutShortApplies, recoverPriceFiles, startCheckWorker } from '../services/price-files/queue'
import { warmSnapshot } from '../services/price-files/snapshot'
import { activateDue } from '../services/price-files/schedule'
import { everyFewSeconds } from '../utils/interval-job'
import { isPostgres } from '../utils/db'

export default defineNitroPlugin((nitro) => {
  setUploadsRoot(String(useRuntimeConfig().uploadsDir || './uploads'))
  const sweep = () => activateDue().catch((err) => console.error('[boreline] price schedule:', err?.message ?? err))
  databaseReady()
    // the compared catalogue is built when someone comes to the price files (warmSnapshotIfCold), not at start: at a
    // million parts it is ~62 MB (and ~100 MB more while it loads) that a process nobody checks price files on need not hold
    .then(async () => { await recoverPriceFiles(); await sweep(); if (process.env.BORELINE_PRICE_SNAPSHOT_AT_START === '1') await warmSnapshot() })
    .catch((err) => console.error('[boreline] price files not recovered:', err?.message ?? err))
  everyFewSeconds(nitro, { setting: 'BORELINE_PRICE_SCHEDULE_SECONDS', defaultSeconds: 15, name: 'price schedule', run: async () => { await activateDue(); if (isPostgres()) await recoverCutShortApplies() }, report: () => {} })
  startCheckWorker(nitro)
})

/**
 * Price files at start and while running: where uploaded files live, checks interrupted by a restart run
 * again, and scheduled versions take effect on time (a sweep every 15 s, plus a timer set when scheduling).
 */
import { setUploadsRoot, recoverUploads } from '../services/price-lists/check'
import { activateDue } from '../services/price-lists/apply'

export default defineNitroPlugin((nitro) => {
  setUploadsRoot(String(useRuntimeConfig().uploadsDir || './uploads'))
  const sweep = () => activateDue().catch((err) => console.error('[boreline] price schedule:', err?.message ?? err))
  databaseReady()
    .then(async () => { await recoverUploads(); await sweep() })
    .catch((err) => console.error('[boreline] price files not recovered:', err?.message ?? err))
  const every = setInterval(sweep, 15_000)
  every.unref?.()
  nitro.hooks.hook('close', () => clearInterval(every))
})

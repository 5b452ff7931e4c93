/** Builds the part-search index in the background once the database is ready, so the first search is quick. */
import { getPartIndex } from '../services/catalogue/catalogue-index'

export default defineNitroPlugin(() => {
  if (process.env.BORELINE_SEARCH_INDEX_AT_START === '0') return
  databaseReady()
    .then(() => getPartIndex())
    .catch((err) => console.error('[boreline] part search index not built:', err?.message ?? err))
})

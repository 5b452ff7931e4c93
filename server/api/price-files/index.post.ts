/**
 * POST /api/price-files (multipart/form-data: `file` = CSV or XLSX; optional text fields `delimiter`
 * auto|comma|semicolon|tab, `decimalMark` point|comma, `supplierName`, `mapping` (JSON ColumnMapping))
 * -> 202 { id, status: "parsing" }
 * The file type is decided from its bytes; the check then runs in the background (one file at a time:
 * a second file waits its turn). Follow it with GET /api/price-files/:id. Distributor staff only.
 * Errors: 401, 403, 413 (over 50 MB, on `file`), 415 (not multipart), 422 (no file, wrong kind of file, bad fields).
 */
import { receivePriceFile } from '../../services/price-files/intake'
import { warmSnapshotIfCold } from '../../services/price-files/snapshot'
import { beforeUpload } from '../../services/upload-intake'

export default defineEventHandler(async (event) => {
  const { user } = await beforeUpload(event.node.req, () => requireAbility(event, 'priceFiles.manage'))
  warmSnapshotIfCold() // built while the file arrives
  const accepted = await receivePriceFile(event.node.req, user.id)
  setResponseStatus(event, 202)
  return accepted
})

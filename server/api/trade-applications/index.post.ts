/**
 * POST /api/trade-applications (multipart/form-data)
 *   fields businessName, tradingAddress, taxNumber, contactName, phone, email, password; file `proof`
 * -> 201 { id, status: "pending" }. Public: a garage applies before anyone of it can sign in.
 * Errors name the field: 422 (missing/invalid fields, short password, e-mail already used, no file, two files),
 * 413 (file over 10 MB), 415 (not a form; a file empty, not PDF/JPEG/PNG by its bytes, or not what its name says).
 * Nothing is kept on any error: no organisation, no person, no file (temporary files are removed on every path).
 */
import { submitTradeApplication } from '../../services/trade-applications'

export default defineEventHandler(async (event) => {
  const application = await submitTradeApplication(event.node.req, String(useRuntimeConfig(event).uploadsDir))
  setResponseStatus(event, 201)
  return application
})

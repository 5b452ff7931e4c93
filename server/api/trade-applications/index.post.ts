/**
 * POST /api/trade-applications (multipart/form-data)
 *   fields businessName, tradingAddress, taxNumber, contactName, phone, email, password; file `proof`
 * -> 201 { status: "pending", message }: the same answer whether or not the e-mail already has an account (its owner
 * is e-mailed instead and nothing is created). Public: a garage applies before anyone of it can sign in.
 * Errors name the field: 422 (missing/invalid fields, a field that cannot be set, a password too easy to guess, no
 * file, two files), 413 (file over 10 MB), 415 (not a form; a file empty, not PDF/JPEG/PNG by its bytes, or not what
 * its name says); 429 after 10 applications from one address in an hour. Nothing is kept on any error: no
 * organisation, no person, no file (temporary files are removed on every path).
 */
import { submitTradeApplication } from '../../services/trade-applications'

export default defineEventHandler(async (event) => {
  const application = await submitTradeApplication(event.node.req, String(useRuntimeConfig(event).uploadsDir), clientAddress(event))
  setResponseStatus(event, 201)
  return application
})

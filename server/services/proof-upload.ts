/**
 * The proof-of-trade upload: taken in by the one upload intake (upload-intake.ts: multipart only, one file of at
 * most 10 MB in the field `proof`, temporary files in `<uploads>/.incoming/` removed on every path), then checked
 * by its bytes (file-type), never by the client's Content-Type or name alone. Plain Node.
 */
import { extname, resolve } from 'node:path'
import type { IncomingMessage } from 'node:http'
import { fileTypeFromFile } from 'file-type'
import { PROOF_FIELD, PROOF_MAX_BYTES, PROOF_TYPES } from '../../shared/schemas/accounts'
import { cleanFileName } from './proof-store'
import { receiveUpload, uploadRefusal, type ReceivedUpload } from './upload-intake'

export const MISSING_PROOF = 'Attach a proof-of-trade document (PDF, JPEG or PNG).'
const TOO_BIG = `The document is larger than ${PROOF_MAX_BYTES / 1024 / 1024} MB. Please send a smaller scan.`

/**
 * The application form with its document in a temporary file (same disk as the store, so storing it is a
 * rename). Call `cleanup()` in `finally`; on a refusal every temporary file is already gone.
 */
export function receiveProof(req: IncomingMessage, uploadsDir: string): Promise<ReceivedUpload> {
  return receiveUpload(req, {
    field: PROOF_FIELD,
    tempDir: resolve(uploadsDir, '.incoming'),
    maxBytes: PROOF_MAX_BYTES,
    messages: {
      tooLarge: TOO_BIG,
      notMultipart: 'Send the application as multipart/form-data (a form with a file).',
      oneFileOnly: 'Attach one document only.',
      incomplete: 'The form arrived incomplete. Please send it again.',
    },
  })
}

export interface CheckedProof { mime: string; ext: string; size: number; originalName: string }

/**
 * Missing: 422. Empty, not a PDF/JPEG/PNG by its bytes, or not what its name says: 415. Each names the field
 * `proof`. The type comes from the first bytes, and the name's extension must agree with it.
 */
export async function checkProofFile(file: ReceivedUpload['file']): Promise<CheckedProof> {
  if (!file) throw uploadRefusal(422, PROOF_FIELD, MISSING_PROOF)
  if (file.size === 0) throw uploadRefusal(415, PROOF_FIELD, 'The document is empty. Please choose the file again.')
  if (file.size > PROOF_MAX_BYTES) throw uploadRefusal(413, PROOF_FIELD, TOO_BIG)
  const detected = await fileTypeFromFile(file.path)
  const allowed = detected ? PROOF_TYPES[detected.mime] : undefined
  if (!detected || !allowed) throw uploadRefusal(415, PROOF_FIELD, 'The document must be a PDF, JPEG or PNG file.')
  const originalName = cleanFileName(file.originalName)
  const claimedExt = extname(originalName).slice(1).toLowerCase()
  if (!claimedExt || !allowed.includes(claimedExt)) {
    throw uploadRefusal(415, PROOF_FIELD, `The file's contents (${detected.ext.toUpperCase()}) do not match its name "${originalName || 'unnamed'}".`)
  }
  return { mime: detected.mime, ext: allowed[0]!, size: file.size, originalName }
}

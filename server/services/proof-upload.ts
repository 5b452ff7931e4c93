/**
 * The proof-of-trade upload: multipart parsing with formidable, type detection from the bytes with file-type,
 * storage under `<uploads>/proofs/` with a server-generated name. Traps closed here (see the security notes):
 * only the multipart plugin is enabled (a raw octet-stream body would bypass the size limit), every temporary
 * file is removed on every path, a dropped or missing file is an error, and the client's name never reaches
 * the disk.
 */
import { mkdir, rm, stat } from 'node:fs/promises'
import { extname, resolve } from 'node:path'
import type { IncomingMessage } from 'node:http'
import formidable, { errors as formidableErrors, multipart, type File } from 'formidable'
import { fileTypeFromFile } from 'file-type'
import { PROOF_FIELD, PROOF_MAX_BYTES, PROOF_TYPES } from '../../shared/schemas/accounts'
import { cleanFileName } from './proof-store'
import { DomainError } from './errors'

export { moveIntoStore, newStoredName, openProof, proofPath } from './proof-store'

export interface ParsedUpload {
  fields: Record<string, string>
  file: File | null
  /** removes every temporary file this request produced; safe to call more than once */
  cleanup: () => Promise<void>
}

function uploadError(statusCode: 413 | 415 | 422, field: string, message: string) {
  return new DomainError(statusCode === 413 ? 'too_large' : statusCode === 415 ? 'unsupported' : 'invalid', message, { fields: { [field]: message } })
}

export const MISSING_PROOF = 'Attach a proof-of-trade document (PDF, JPEG or PNG).'
const TOO_BIG = `The document is larger than ${PROOF_MAX_BYTES / 1024 / 1024} MB. Please send a smaller scan.`

/**
 * Parses the multipart body into `<uploads>/.incoming/` (same disk as the store, so the final move is a
 * rename; one folder per installation). On any error every temporary file is already gone when this throws.
 */
export async function parseProofUpload(req: IncomingMessage, uploadsDir: string): Promise<ParsedUpload> {
  const incoming = resolve(uploadsDir, '.incoming')
  await mkdir(incoming, { recursive: true })
  const temporary = new Set<string>()
  const cleanup = async () => {
    await Promise.all([...temporary].map((p) => rm(p, { force: true })))
  }
  const form = formidable({
    // the plugin itself: formidable 3.5.4 refuses plugin names given as strings
    enabledPlugins: [multipart],
    uploadDir: incoming,
    maxFiles: 1,
    maxFileSize: PROOF_MAX_BYTES,
    maxTotalFileSize: PROOF_MAX_BYTES,
    maxFields: 20,
    maxFieldsSize: 64 * 1024,
    allowEmptyFiles: true, // an empty file gets our own 415 with the field named, below
    minFileSize: 0,
    keepExtensions: false,
    filter: (part) => part.name === PROOF_FIELD,
  })
  form.on('fileBegin', (_name, file) => { temporary.add(file.filepath) })
  try {
    const [fields, files] = await form.parse(req)
    const flat: Record<string, string> = {}
    for (const [k, v] of Object.entries(fields)) if (v?.length) flat[k] = String(v[0])
    return { fields: flat, file: files[PROOF_FIELD]?.[0] ?? null, cleanup }
  } catch (err) {
    // formidable stops reading when it fails; drain the rest so the client receives our answer
    req.resume()
    // files being written are unlinked by formidable a tick later; ours go now, and again after that tick
    await cleanup()
    setTimeout(() => { void cleanup() }, 50)
    throw mapFormidableError(err)
  }
}

function mapFormidableError(err: unknown) {
  const code = (err as { code?: number }).code
  switch (code) {
    case formidableErrors.biggerThanMaxFileSize:
    case formidableErrors.biggerThanTotalMaxFileSize:
      return uploadError(413, PROOF_FIELD, TOO_BIG)
    case formidableErrors.maxFilesExceeded:
      return uploadError(422, PROOF_FIELD, 'Attach one document only.')
    case formidableErrors.maxFieldsSizeExceeded:
    case formidableErrors.maxFieldsExceeded:
      return uploadError(413, '_', 'The form has more text than expected.')
    case formidableErrors.noParser:
    case formidableErrors.missingContentType:
    case formidableErrors.missingMultipartBoundary:
      return uploadError(415, '_', 'Send the application as multipart/form-data (a form with a file).')
    case formidableErrors.malformedMultipart:
    case formidableErrors.aborted:
      return uploadError(422, '_', 'The form arrived incomplete. Please send it again.')
    default:
      console.error('[boreline] upload failed:', (err as Error)?.message ?? err)
      return new DomainError('failed', 'The upload could not be processed.')
  }
}

export interface CheckedProof { mime: string; ext: string; size: number; originalName: string }

/**
 * Empty, not a PDF/JPEG/PNG by its bytes, or not what its name says: 415 naming the field `proof`.
 * Missing: 422. The type comes from the first bytes, never from the client's Content-Type.
 */
export async function checkProofFile(file: File | null): Promise<CheckedProof> {
  if (!file) throw uploadError(422, PROOF_FIELD, MISSING_PROOF)
  const size = file.size ?? (await stat(file.filepath)).size
  if (size === 0) throw uploadError(415, PROOF_FIELD, 'The document is empty. Please choose the file again.')
  if (size > PROOF_MAX_BYTES) throw uploadError(413, PROOF_FIELD, TOO_BIG)
  const detected = await fileTypeFromFile(file.filepath)
  const allowed = detected ? PROOF_TYPES[detected.mime] : undefined
  if (!detected || !allowed) {
    throw uploadError(415, PROOF_FIELD, 'The document must be a PDF, JPEG or PNG file.')
  }
  const originalName = cleanFileName(file.originalFilename ?? '')
  const claimedExt = extname(originalName).slice(1).toLowerCase()
  if (!claimedExt || !allowed.includes(claimedExt)) {
    throw uploadError(415, PROOF_FIELD, `The file's contents (${detected.ext.toUpperCase()}) do not match its name "${originalName || 'unnamed'}".`)
  }
  return { mime: detected.mime, ext: allowed[0]!, size, originalName }
}

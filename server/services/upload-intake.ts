/**
 * The one upload intake: a multipart body with one file field, streamed by formidable into a temporary folder
 * under a server-made name (never the client's). Traps closed here for every upload (proof of trade, garage logo,
 * price file): only the multipart plugin is enabled (a raw octet-stream body would skip the size limit and the
 * field filter), at most one file of at most `maxBytes`, fields of other names are not stored, and every temporary
 * file is removed on every failure path. Each caller names its field and words its refusals; all of them answer
 * with the field named (413 too large, 415 not multipart, 422 missing, twice or cut short).
 * Plain Node: the request is the Node request (`event.node.req`).
 */
import { randomUUID } from 'node:crypto'
import type { IncomingMessage } from 'node:http'
import { mkdir, rm } from 'node:fs/promises'
import formidable, { errors as formidableErrors, multipart } from 'formidable'
import { DomainError } from './errors'

export interface UploadSpec {
  /** the form field that carries the file */
  field: string
  /** the temporary folder (same disk as the store where possible, so storing is a rename) */
  tempDir: string
  maxBytes: number
  /** text fields allowed beside the file, and their total size */
  maxFields?: number
  maxFieldsBytes?: number
  /** where a refusal of the form as a whole is shown: `_` (above the form) unless the form is only this field */
  formField?: string
  messages: {
    tooLarge: string
    notMultipart: string
    oneFileOnly: string
    incomplete: string
    /** a file sent in a field of another name (default: ignored, as if none came) */
    wrongField?: string
  }
}

export interface ReceivedUpload {
  /** text fields, first value of each */
  fields: Record<string, string>
  file: { path: string; originalName: string; size: number } | null
  /** removes the temporary file; safe to call more than once (call it in `finally`) */
  cleanup: () => Promise<void>
}

/** A refusal of the upload, named on its field (or on `_` for the form as a whole). */
export function uploadRefusal(status: 413 | 415 | 422, field: string, message: string): DomainError {
  return new DomainError(status === 413 ? 'too_large' : status === 415 ? 'unsupported' : 'invalid', message, { fields: { [field]: message } })
}

export async function receiveUpload(req: IncomingMessage, spec: UploadSpec): Promise<ReceivedUpload> {
  const type = String(req.headers['content-type'] ?? '')
  if (!/^multipart\/form-data/i.test(type)) {
    req.resume()
    throw uploadRefusal(415, spec.formField ?? '_', spec.messages.notMultipart)
  }
  await mkdir(spec.tempDir, { recursive: true })
  const temporary = new Set<string>()
  const cleanup = async () => { await Promise.all([...temporary].map((p) => rm(p, { force: true }))) }
  let otherField = false
  const form = formidable({
    // the plugin itself: formidable 3.5.4 refuses plugin names given as strings
    enabledPlugins: [multipart],
    uploadDir: spec.tempDir,
    maxFiles: 1,
    maxFileSize: spec.maxBytes,
    maxTotalFileSize: spec.maxBytes,
    maxFields: spec.maxFields ?? 20,
    maxFieldsSize: spec.maxFieldsBytes ?? 64 * 1024,
    allowEmptyFiles: true, // an empty file gets the caller's own clear message, with the field named
    minFileSize: 0,
    keepExtensions: false,
    filename: () => `${randomUUID()}.upload`,
    // called for file parts only (text fields never reach it)
    filter: (part) => {
      if (part.name === spec.field) return true
      otherField = true
      return false
    },
  })
  form.on('fileBegin', (_name, file) => { temporary.add(file.filepath) })
  try {
    const [fields, files] = await form.parse(req)
    const f = files[spec.field]?.[0]
    if (!f && otherField && spec.messages.wrongField) throw uploadRefusal(422, spec.field, spec.messages.wrongField)
    const flat: Record<string, string> = {}
    for (const [k, v] of Object.entries(fields)) if (v?.length) flat[k] = String(v[0])
    return {
      fields: flat,
      file: f ? { path: f.filepath, originalName: (f.originalFilename ?? '').slice(0, 255), size: f.size } : null,
      cleanup,
    }
  } catch (err) {
    // formidable stops reading when it fails; drain the rest so the client receives our answer, and wait briefly for
    // its end: answered while the body is still coming, the connection is closed under a client still sending (EPIPE,
    // a browser's "connection reset" instead of the message); a body that goes on for long gets the answer anyway
    req.resume()
    await endOrTimeout(req, 2000)
    // a file being written is unlinked by formidable a tick later; ours go now, and again after that tick
    await cleanup()
    setTimeout(() => { void cleanup() }, 50)
    throw refusalOf(err, spec)
  }
}

/**
 * Runs what must hold before an upload is read (who may send it). A refusal drains the body first, as the intake's own
 * do: answered while a large file is still coming, the client would get a broken pipe (EPIPE) instead of the answer.
 */
export async function beforeUpload<T>(req: IncomingMessage, check: () => T): Promise<T> {
  try {
    return check()
  } catch (err) {
    req.resume()
    await endOrTimeout(req, 2000)
    throw err
  }
}

function endOrTimeout(req: IncomingMessage, ms: number): Promise<void> {
  if (req.complete || req.readableEnded) return Promise.resolve()
  return new Promise((resolve) => {
    const timer = setTimeout(done, ms)
    function done() {
      clearTimeout(timer)
      req.off('end', done).off('close', done).off('error', done)
      resolve()
    }
    req.once('end', done).once('close', done).once('error', done)
  })
}

function refusalOf(err: unknown, spec: UploadSpec): Error {
  if (err instanceof DomainError) return err
  switch ((err as { code?: number }).code) {
    case formidableErrors.biggerThanMaxFileSize:
    case formidableErrors.biggerThanTotalMaxFileSize:
      return uploadRefusal(413, spec.field, spec.messages.tooLarge)
    case formidableErrors.maxFilesExceeded:
      return uploadRefusal(422, spec.field, spec.messages.oneFileOnly)
    case formidableErrors.maxFieldsSizeExceeded:
    case formidableErrors.maxFieldsExceeded:
      return uploadRefusal(413, spec.formField ?? '_', 'The form has more text than expected.')
    case formidableErrors.noParser:
    case formidableErrors.missingContentType:
    case formidableErrors.missingMultipartBoundary:
      return uploadRefusal(415, spec.formField ?? '_', spec.messages.notMultipart)
    default:
      return uploadRefusal(422, spec.formField ?? '_', spec.messages.incomplete)
  }
}

/**
 * Receiving a price file: formidable streams the multipart body to a temporary file under a server-made name
 * (never the client's), multipart only (a raw octet-stream body would bypass the size limit), one file of at
 * most 50 MB, and every temporary file is removed on every error path.
 */
import { randomUUID } from 'node:crypto'
import type { IncomingMessage } from 'node:http'
import { mkdir, unlink } from 'node:fs/promises'
import formidable, { errors as formidableErrors, multipart } from 'formidable'
import { PRICE_FILE_LIMITS } from '../../../shared/types/price-files'
import { DomainError, invalidInput, isDomainError } from '../errors'

export interface ReceivedFile {
  path: string
  originalName: string
  size: number
}

export interface Received {
  fields: Record<string, string>
  file: ReceivedFile | null
}

const MB = 1024 * 1024

export async function receivePriceFile(req: IncomingMessage, tmpDir: string): Promise<Received> {
  const type = String(req.headers['content-type'] ?? '')
  if (!/^multipart\/form-data/i.test(type)) {
    throw new DomainError('unsupported', 'Send the price file as multipart/form-data, in a field named “file”.')
  }
  await mkdir(tmpDir, { recursive: true })
  const created: string[] = []
  const form = formidable({
    uploadDir: tmpDir,
    enabledPlugins: [multipart],
    maxFiles: 1,
    maxFileSize: PRICE_FILE_LIMITS.maxBytes,
    maxTotalFileSize: PRICE_FILE_LIMITS.maxBytes,
    maxFields: 12,
    maxFieldsSize: 64 * 1024,
    allowEmptyFiles: true, // an empty file gets our own clear message below
    minFileSize: 0,
    keepExtensions: false,
    filename: () => `${randomUUID()}.upload`,
  })
  form.on('fileBegin', (_name, file) => { created.push(file.filepath) })
  try {
    const [fields, files] = await form.parse(req)
    const list = files.file ?? []
    const others = Object.entries(files).filter(([k]) => k !== 'file').flatMap(([, v]) => v ?? [])
    for (const f of others) await unlink(f.filepath).catch(() => {})
    if (others.length && !list.length) {
      throw invalidInput({ file: 'Send the price file in the field named “file”.' })
    }
    const f = list[0]
    const flat: Record<string, string> = {}
    for (const [k, v] of Object.entries(fields)) if (v && v.length) flat[k] = String(v[0])
    return {
      fields: flat,
      file: f ? { path: f.filepath, originalName: (f.originalFilename ?? 'price-file').slice(0, 255), size: f.size } : null,
    }
  } catch (err) {
    for (const p of created) await unlink(p).catch(() => {})
    if (isDomainError(err)) throw err
    const code = (err as { code?: number }).code
    if (code === formidableErrors.biggerThanMaxFileSize || code === formidableErrors.biggerThanTotalMaxFileSize) {
      throw new DomainError('too_large', `The file is larger than ${PRICE_FILE_LIMITS.maxBytes / MB} MB. Split it into smaller files.`, { fields: { file: `The file is larger than ${PRICE_FILE_LIMITS.maxBytes / MB} MB.` } })
    }
    if (code === formidableErrors.maxFilesExceeded) throw invalidInput({ file: 'Upload one price file at a time.' })
    if (code === formidableErrors.maxFieldsExceeded || code === formidableErrors.maxFieldsSizeExceeded) {
      throw invalidInput({ _: 'The form sent too many or too large fields.' })
    }
    throw invalidInput({ file: 'The upload could not be read. Try again.' })
  }
}

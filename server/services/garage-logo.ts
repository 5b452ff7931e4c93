/**
 * The garage's logo: uploaded with formidable (multipart only, one file, under 2 MB), recognised from its bytes
 * (file-type for PNG and JPEG; SVG by parsing its start), stored as `<uploads>/logos/<32 hex>.<png|jpg|svg>`.
 *
 * SVG is a document that can carry script, so instead of trying to clean one we refuse any SVG that holds
 * anything beyond drawing: script, foreignObject, event handler attributes, links or references outside the
 * file, entity declarations, style imports. What passes is still served only with a CSP that forbids script
 * and with nosniff (see the logo routes).
 */
import { createReadStream } from 'node:fs'
import { mkdir, readFile, rm, stat } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { moveIntoStore, newStoredName, storeDir, storedPath, type FileStore } from './stored-files'
import type { IncomingMessage } from 'node:http'
import formidable, { errors as formidableErrors, multipart, type File } from 'formidable'
import { fileTypeFromFile } from 'file-type'
import { LOGO_LIMITS } from '../../shared/schemas/quotes'
import { DomainError } from './errors'

export const LOGO_FIELD = 'logo'
const INCOMING = join(tmpdir(), 'boreline-incoming')
const EXT: Record<string, string> = { 'image/png': 'png', 'image/jpeg': 'jpg', 'image/svg+xml': 'svg' }

/** A refusal of the upload, named on the `logo` field. */
function logoError(statusCode: 413 | 415 | 422, message: string): DomainError {
  return new DomainError(statusCode === 413 ? 'too_large' : statusCode === 415 ? 'unsupported' : 'invalid', message, { fields: { [LOGO_FIELD]: message } })
}

/** Parses the multipart body; every temporary file is removed on every path (the caller calls cleanup too). */
export async function parseLogoUpload(req: IncomingMessage): Promise<{ file: File | null; cleanup: () => Promise<void> }> {
  await mkdir(INCOMING, { recursive: true })
  const temporary = new Set<string>()
  const cleanup = async () => { await Promise.all([...temporary].map((p) => rm(p, { force: true }))) }
  const form = formidable({
    enabledPlugins: [multipart], // a raw octet-stream body would otherwise skip maxFileSize and filter
    uploadDir: INCOMING,
    maxFiles: 1,
    maxFileSize: LOGO_LIMITS.maxBytes,
    maxTotalFileSize: LOGO_LIMITS.maxBytes,
    maxFields: 5,
    maxFieldsSize: 8 * 1024,
    allowEmptyFiles: true,
    minFileSize: 0,
    keepExtensions: false,
    filter: (part) => part.name === LOGO_FIELD,
  })
  form.on('fileBegin', (_name, file) => { temporary.add(file.filepath) })
  try {
    const [, files] = await form.parse(req)
    return { file: files[LOGO_FIELD]?.[0] ?? null, cleanup }
  } catch (err) {
    req.resume()
    await cleanup()
    setTimeout(() => { void cleanup() }, 50)
    const code = (err as { code?: number }).code
    if (code === formidableErrors.biggerThanMaxFileSize || code === formidableErrors.biggerThanTotalMaxFileSize) {
      throw logoError(413, 'The logo must be smaller than 2 MB.')
    }
    if (code === formidableErrors.maxFilesExceeded) throw logoError(422, 'Choose one logo file.')
    if (code === formidableErrors.noParser || code === formidableErrors.missingContentType || code === formidableErrors.missingMultipartBoundary) {
      throw logoError(415, 'Send the logo as multipart/form-data.')
    }
    throw logoError(422, 'The upload arrived incomplete. Please try again.')
  }
}

/** What in an SVG makes us refuse it (null when it only draws). Exported for the unit tests. */
export function svgProblem(text: string): string | null {
  const body = text.replace(/^\uFEFF/, '')
  if (!/^\s*(<\?xml[^>]*\?>\s*)?(<!--[\s\S]*?-->\s*)*<svg[\s>]/i.test(body)) return 'This is not an SVG image.'
  const checks: [RegExp, string][] = [
    [/<!DOCTYPE|<!ENTITY/i, 'declarations (DOCTYPE/ENTITY)'],
    [/<\s*([\w-]+:)?script[\s/>]/i, 'a script'],
    [/<\s*([\w-]+:)?foreignObject[\s/>]/i, 'embedded HTML (foreignObject)'],
    [/<\s*([\w-]+:)?(iframe|embed|object|audio|video|image|use|a|animate\w*|set|handler|listener)[\s/>]/i, 'links, animations or embedded content'],
    [/\son[a-z]+\s*=/i, 'event handlers (on… attributes)'],
    [/(href|src)\s*=/i, 'references to other files'],
    [/javascript:|vbscript:|data:text\/html/i, 'script addresses'],
    [/@import|url\(\s*['"]?(?!#)/i, 'external styles or images'],
    [/&#/i, 'encoded characters'], // character references could hide any of the above
  ]
  for (const [re, what] of checks) if (re.test(body)) return `SVG logos may only draw shapes and text; this one contains ${what}. Save it as a plain SVG or PNG.`
  return null
}

/** Checks the uploaded file by its bytes; returns the type to store it as. */
export async function checkLogoFile(file: File | null): Promise<{ mime: string; ext: string; size: number }> {
  if (!file) throw logoError(422, 'Choose a logo file (PNG, JPEG or SVG).')
  const size = file.size ?? (await stat(file.filepath)).size
  if (size === 0) throw logoError(415, 'The file is empty. Choose the logo again.')
  if (size > LOGO_LIMITS.maxBytes) throw logoError(413, 'The logo must be smaller than 2 MB.')
  const detected = await fileTypeFromFile(file.filepath)
  if (detected && (detected.mime === 'image/png' || detected.mime === 'image/jpeg')) {
    return { mime: detected.mime, ext: EXT[detected.mime]!, size }
  }
  // an SVG that starts with an XML declaration is recognised as XML; it is checked as an SVG below
  if (detected && detected.mime !== 'application/xml' && detected.mime !== 'image/svg+xml') {
    throw logoError(415, `The logo must be PNG, JPEG or SVG (this file is ${detected.ext.toUpperCase()}).`)
  }
  const text = await readFile(file.filepath, 'utf8')
  const problem = svgProblem(text)
  if (problem) throw logoError(415, problem === 'This is not an SVG image.' ? 'The logo must be PNG, JPEG or SVG.' : problem)
  return { mime: 'image/svg+xml', ext: 'svg', size }
}

const LOGOS: FileStore = { folder: 'logos', extensions: ['png', 'jpg', 'svg'] }

export function logosDir(uploadsDir: string): string {
  return storeDir(uploadsDir, LOGOS)
}

/** The stored logo's path, refusing anything that is not one of our own names. */
export function logoPath(uploadsDir: string, storedName: string): string {
  return storedPath(uploadsDir, LOGOS, storedName)
}

export function newLogoName(ext: string): string {
  return newStoredName(ext)
}

export async function storeLogo(tempPath: string, uploadsDir: string, storedName: string): Promise<void> {
  await moveIntoStore(tempPath, uploadsDir, LOGOS, storedName)
}

export async function removeLogo(uploadsDir: string, storedName: string | null | undefined): Promise<void> {
  if (!storedName) return
  try { await rm(logoPath(uploadsDir, storedName), { force: true }) } catch { /* not ours: nothing to remove */ }
}

export async function readLogo(uploadsDir: string, storedName: string): Promise<Buffer | null> {
  try { return await readFile(logoPath(uploadsDir, storedName)) } catch { return null }
}

export function openLogo(uploadsDir: string, storedName: string) {
  return createReadStream(logoPath(uploadsDir, storedName))
}

/**
 * The garage's logo: received through the one upload intake (multipart, one file field `logo`, under 2 MB),
 * recognised from its bytes (file-type for PNG and JPEG; SVG by parsing its start), stored as
 * `<uploads>/logos/<32 hex>.<png|jpg|svg>`.
 *
 * SVG is a document that can carry script, so instead of trying to clean one we refuse any SVG that holds
 * anything beyond drawing: script, foreignObject, event handler attributes, links or references outside the
 * file, entity declarations, style imports. What passes is still served only with a CSP that forbids script
 * and with nosniff (see the logo routes).
 */
import { createReadStream } from 'node:fs'
import { readFile, rm, stat } from 'node:fs/promises'
import type { IncomingMessage } from 'node:http'
import { join } from 'node:path'
import { fileTypeFromFile } from 'file-type'
import { moveIntoStore, newStoredName, storeDir, storedPath, type FileStore } from './stored-files'
import { receiveUpload, uploadRefusal, type ReceivedUpload } from './upload-intake'
import { LOGO_LIMITS } from '../../shared/schemas/quotes'

export const LOGO_FIELD = 'logo'
const EXT: Record<string, string> = { 'image/png': 'png', 'image/jpeg': 'jpg', 'image/svg+xml': 'svg' }
const TOO_LARGE = 'The logo must be smaller than 2 MB.'

const logoRefusal = (status: 413 | 415 | 422, message: string) => uploadRefusal(status, LOGO_FIELD, message)

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

export interface CheckedLogo { mime: string; ext: string; size: number }

/** Checks the uploaded file by its bytes; returns the type to store it as. */
export async function checkLogoFile(file: ReceivedUpload['file']): Promise<CheckedLogo> {
  if (!file) throw logoRefusal(422, 'Choose a logo file (PNG, JPEG or SVG).')
  const size = file.size ?? (await stat(file.path)).size
  if (size === 0) throw logoRefusal(415, 'The file is empty. Choose the logo again.')
  if (size > LOGO_LIMITS.maxBytes) throw logoRefusal(413, TOO_LARGE)
  const detected = await fileTypeFromFile(file.path)
  if (detected && (detected.mime === 'image/png' || detected.mime === 'image/jpeg')) {
    return { mime: detected.mime, ext: EXT[detected.mime]!, size }
  }
  // an SVG that starts with an XML declaration is recognised as XML; it is checked as an SVG below
  if (detected && detected.mime !== 'application/xml' && detected.mime !== 'image/svg+xml') {
    throw logoRefusal(415, `The logo must be PNG, JPEG or SVG (this file is ${detected.ext.toUpperCase()}).`)
  }
  const text = await readFile(file.path, 'utf8')
  const problem = svgProblem(text)
  if (problem) throw logoRefusal(415, problem === 'This is not an SVG image.' ? 'The logo must be PNG, JPEG or SVG.' : problem)
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

export interface StoredLogo extends CheckedLogo { file: string }

/**
 * Receives, checks and stores an uploaded logo under a new name. On every path the temporary file is gone;
 * nothing is stored when the file is refused.
 */
export async function receiveLogo(req: IncomingMessage, uploadsDir: string): Promise<StoredLogo> {
  let upload: ReceivedUpload | undefined
  try {
    upload = await receiveUpload(req, {
      field: LOGO_FIELD,
      tempDir: join(uploadsDir, '.incoming'),
      maxBytes: LOGO_LIMITS.maxBytes,
      maxFields: 5,
      maxFieldsBytes: 8 * 1024,
      formField: LOGO_FIELD, // the logo form has one field: a refusal of the form is shown beside it
      messages: {
        tooLarge: TOO_LARGE,
        notMultipart: 'Send the logo as multipart/form-data.',
        oneFileOnly: 'Choose one logo file.',
        incomplete: 'The upload arrived incomplete. Please try again.',
      },
    })
    const checked = await checkLogoFile(upload.file)
    const file = newStoredName(checked.ext)
    await moveIntoStore(upload.file!.path, uploadsDir, LOGOS, file)
    return { file, ...checked }
  } finally {
    await upload?.cleanup()
  }
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

/**
 * Whether CSV text is UTF-8, and where it is not: the refusal names the line and the byte, so the person can find
 * it and save the file again as "CSV UTF-8".
 */
import { createReadStream } from 'node:fs'
import { setImmediate as yieldToLoop } from 'node:timers/promises'
import { PriceFileError } from './file-rows'

/**
 * Scans bytes as UTF-8 (RFC 3629 §4: no overlongs, no surrogates, nothing above U+10FFFF). Returns the offset
 * of the first bad byte (`bad`, -1 if none) and where an unfinished sequence at the very end starts (`tail`,
 * the length when there is none): with `final` false such a tail is left for the next chunk.
 */
function scanUtf8(buf: Uint8Array, final: boolean): { bad: number; tail: number } {
  let i = 0
  const n = buf.length
  while (i < n) {
    const b = buf[i]!
    if (b < 0x80) { i++; continue }
    let need: number
    let lo = 0x80
    let hi = 0xbf
    if (b >= 0xc2 && b <= 0xdf) need = 1
    else if (b === 0xe0) { need = 2; lo = 0xa0 }
    else if ((b >= 0xe1 && b <= 0xec) || b === 0xee || b === 0xef) need = 2
    else if (b === 0xed) { need = 2; hi = 0x9f }
    else if (b === 0xf0) { need = 3; lo = 0x90 }
    else if (b >= 0xf1 && b <= 0xf3) need = 3
    else if (b === 0xf4) { need = 3; hi = 0x8f }
    else return { bad: i, tail: n }
    for (let k = 1; k <= need; k++) {
      if (i + k >= n) return final ? { bad: i, tail: n } : { bad: -1, tail: i }
      const c = buf[i + k]!
      if (c < (k === 1 ? lo : 0x80) || c > (k === 1 ? hi : 0xbf)) return { bad: i, tail: n }
    }
    i += need + 1
  }
  return { bad: -1, tail: n }
}

/** Offset of the first byte that is not part of well-formed UTF-8, or -1. */
export function firstInvalidUtf8(buf: Uint8Array): number {
  return scanUtf8(buf, true).bad
}

/** Line (1-based) and byte offset of the first bad UTF-8 byte in a file, scanning it in chunks. */
export async function locateInvalidUtf8(path: string): Promise<{ line: number; offset: number; byte: number } | null> {
  let line = 1
  let base = 0
  let carry: Buffer = Buffer.alloc(0)
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) {
    const buf = carry.length ? Buffer.concat([carry, chunk as Buffer]) : (chunk as Buffer)
    const { bad, tail } = scanUtf8(buf, false)
    const end = bad >= 0 ? bad : tail
    for (let i = 0; i < end; i++) if (buf[i] === 0x0a) line++
    if (bad >= 0) return { line, offset: base + bad, byte: buf[bad]! }
    base += tail
    carry = Buffer.from(buf.subarray(tail))
    await yieldToLoop()
  }
  if (carry.length) return { line, offset: base, byte: carry[0]! }
  return null
}

export async function encodingError(path: string): Promise<PriceFileError> {
  const at = await locateInvalidUtf8(path)
  if (!at) return new PriceFileError('The file is not valid UTF-8 text.', 'encoding')
  const hex = at.byte.toString(16).toUpperCase().padStart(2, '0')
  const legacy = at.byte >= 0x80 ? ' It looks like text saved in an older encoding such as Windows-1252 or ISO-8859-1.' : ''
  return new PriceFileError(
    `The file is not valid UTF-8 text: line ${at.line} has the byte 0x${hex} (byte ${at.offset + 1} of the file), which UTF-8 does not allow.${legacy} Save the file as “CSV UTF-8” and upload it again; nothing has been changed.`,
    'encoding',
  )
}

/**
 * Drops the metadata an image file can carry (camera, time and location) and keeps the picture. The app re-encodes
 * photos in the browser with a canvas, which writes none; this is the server's own guard for any client that sends
 * the camera's file as it is. JPEG: the APP1 (Exif, XMP), APP13 (IPTC) and comment segments go; PNG: the eXIf, text
 * and time chunks go. Anything that does not parse is refused rather than passed on. Plain Node.
 */

const JPEG_DROPPED = new Set([0xe1, 0xed, 0xfe])
const PNG_DROPPED = new Set(['eXIf', 'tEXt', 'zTXt', 'iTXt', 'tIME'])
const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])

/** A JPEG without its metadata segments; null when the segment structure does not parse. */
export function stripJpegMetadata(data: Buffer): Buffer | null {
  if (data.length < 4 || data[0] !== 0xff || data[1] !== 0xd8) return null
  const kept: Buffer[] = [data.subarray(0, 2)]
  let i = 2
  while (i + 4 <= data.length) {
    if (data[i] !== 0xff) return null
    const marker = data[i + 1]!
    if (marker === 0xda) { kept.push(data.subarray(i)); return Buffer.concat(kept) } // start of scan: the picture itself
    if (marker === 0xd9) { kept.push(data.subarray(i, i + 2)); return Buffer.concat(kept) }
    const length = data.readUInt16BE(i + 2)
    if (length < 2 || i + 2 + length > data.length) return null
    if (!JPEG_DROPPED.has(marker)) kept.push(data.subarray(i, i + 2 + length))
    i += 2 + length
  }
  return null
}

/** A PNG without its metadata chunks; null when the chunk structure does not parse. */
export function stripPngMetadata(data: Buffer): Buffer | null {
  if (data.length < 8 || !data.subarray(0, 8).equals(PNG_SIGNATURE)) return null
  const kept: Buffer[] = [data.subarray(0, 8)]
  let i = 8
  while (i + 12 <= data.length) {
    const length = data.readUInt32BE(i)
    const type = data.toString('latin1', i + 4, i + 8)
    const end = i + 12 + length
    if (end > data.length) return null
    if (!PNG_DROPPED.has(type)) kept.push(data.subarray(i, end))
    i = end
    if (type === 'IEND') return Buffer.concat(kept)
  }
  return null
}

/** The image without metadata, or null when it does not parse as the type its bytes claim. */
export function stripImageMetadata(data: Buffer, mime: 'image/jpeg' | 'image/png'): Buffer | null {
  return mime === 'image/jpeg' ? stripJpegMetadata(data) : stripPngMetadata(data)
}

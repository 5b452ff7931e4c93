/**
 * A photo from the phone's camera made ready to send: turned the right way up, scaled to at most PHOTO_LIMITS'
 * longest edge and re-encoded as JPEG through a canvas. Re-encoding keeps only the pixels, so the camera's metadata
 * (time, device and location) never leaves the phone.
 */
import { PHOTO_LIMITS } from '#shared/schemas/inspections'

/** The longest edge after scaling, keeping the proportions. */
export function scaledSize(width: number, height: number, maxEdge: number = PHOTO_LIMITS.maxEdgePx): { width: number; height: number } {
  const scale = Math.min(1, maxEdge / Math.max(width, height))
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) }
}

/** The photo resized and re-encoded as JPEG. @throws Error when the file is not an image the browser can read. */
export async function preparedPhoto(file: Blob): Promise<Blob> {
  let bitmap: ImageBitmap
  try {
    bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' })
  } catch {
    throw new Error('This file is not a photo the browser can read. Take the photo again.')
  }
  const size = scaledSize(bitmap.width, bitmap.height)
  const canvas = document.createElement('canvas')
  canvas.width = size.width
  canvas.height = size.height
  const ctx = canvas.getContext('2d')
  if (!ctx) throw new Error('The photo could not be prepared on this device.')
  ctx.drawImage(bitmap, 0, 0, size.width, size.height)
  bitmap.close()
  return new Promise((resolve, reject) => {
    canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('The photo could not be prepared on this device.'))), 'image/jpeg', 0.85)
  })
}

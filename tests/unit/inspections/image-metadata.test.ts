/**
 * Photos lose what the camera wrote besides the picture: a JPEG's Exif (with its GPS position) and a PNG's text and
 * eXIf chunks, while the picture's own segments stay byte for byte (JPEG: ISO/IEC 10918-1 marker segments; PNG:
 * ISO/IEC 15948 chunks).
 */
import { describe, expect, it } from 'vitest'
import { stripJpegMetadata, stripPngMetadata } from '../../../server/services/image-metadata'

const segment = (marker: number, body: Buffer) => Buffer.concat([Buffer.from([0xff, marker]), Buffer.from([(body.length + 2) >> 8, (body.length + 2) & 0xff]), body])
const jfif = segment(0xe0, Buffer.from('JFIF\0\x01\x01\0\0\x01\0\x01\0\0', 'latin1'))
const exif = segment(0xe1, Buffer.from('Exif\0\0GPSLatitude 51.5 N', 'latin1'))
const quant = segment(0xdb, Buffer.alloc(65, 1))
const scan = Buffer.concat([segment(0xda, Buffer.alloc(10, 2)), Buffer.from([0x12, 0x34, 0xff, 0x00, 0x56]), Buffer.from([0xff, 0xd9])])

function chunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8)
  head.writeUInt32BE(data.length, 0)
  head.write(type, 4, 'latin1')
  return Buffer.concat([head, data, Buffer.alloc(4)]) // the CRC is carried over as it is; its value is not checked here
}
const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])

describe('metadata is dropped, the picture kept', () => {
  it('JPEG: the Exif segment (with its GPS text) goes; SOI, JFIF, tables and the scan stay', () => {
    const file = Buffer.concat([Buffer.from([0xff, 0xd8]), jfif, exif, quant, scan])
    const out = stripJpegMetadata(file)!
    expect(out.includes(Buffer.from('GPSLatitude'))).toBe(false)
    expect(out).toEqual(Buffer.concat([Buffer.from([0xff, 0xd8]), jfif, quant, scan]))
  })

  it('PNG: tEXt and eXIf chunks go; IHDR, IDAT and IEND stay', () => {
    const ihdr = chunk('IHDR', Buffer.alloc(13, 1))
    const idat = chunk('IDAT', Buffer.alloc(20, 3))
    const iend = chunk('IEND', Buffer.alloc(0))
    const file = Buffer.concat([PNG, ihdr, chunk('tEXt', Buffer.from('Location\0Millbrook', 'latin1')), chunk('eXIf', Buffer.alloc(12)), idat, iend])
    expect(stripPngMetadata(file)).toEqual(Buffer.concat([PNG, ihdr, idat, iend]))
  })

  it('anything that does not parse is refused (null), never passed on', () => {
    expect(stripJpegMetadata(Buffer.from('not a jpeg'))).toBeNull()
    expect(stripJpegMetadata(Buffer.concat([Buffer.from([0xff, 0xd8]), Buffer.from([0xff, 0xe1, 0x40, 0x00])]))).toBeNull()
    expect(stripPngMetadata(Buffer.concat([PNG, Buffer.from([0, 0, 0, 99])]))).toBeNull()
  })
})

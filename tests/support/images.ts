/**
 * Small image files for the photo tests, made here rather than kept as binaries: a real PNG (zlib-compressed rows,
 * CRC-32 per chunk, ISO/IEC 15948) that browsers decode, with a text chunk naming a place; and a JPEG-shaped file
 * carrying an Exif segment with a GPS position, for the server's own metadata guard (its picture data is not
 * decodable, which the server never needs to do).
 */
import { crc32, deflateSync } from 'node:zlib'

function chunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8)
  head.writeUInt32BE(data.length, 0)
  head.write(type, 4, 'latin1')
  const crc = Buffer.alloc(4)
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])) >>> 0, 0)
  return Buffer.concat([head, data, crc])
}

/** A width × height RGB PNG: a disc-grey field with a rust-brown band, and a `tEXt` "Location" chunk. */
export function pngPhoto(width = 320, height = 240): Buffer {
  const ihdr = Buffer.alloc(13)
  ihdr.writeUInt32BE(width, 0)
  ihdr.writeUInt32BE(height, 4)
  ihdr[8] = 8 // bit depth
  ihdr[9] = 2 // RGB
  const rows: Buffer[] = []
  for (let y = 0; y < height; y++) {
    const row = Buffer.alloc(1 + width * 3)
    for (let x = 0; x < width; x++) {
      const band = y > height * 0.4 && y < height * 0.6
      row.set(band ? [142, 74, 38] : [120 + (x % 40), 124, 130], 1 + x * 3)
    }
    rows.push(row)
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('tEXt', Buffer.from('Location\0Millbrook Motors, bay 2, 51.5072 N 0.1276 W', 'latin1')),
    chunk('IDAT', deflateSync(Buffer.concat(rows))),
    chunk('IEND', Buffer.alloc(0)),
  ])
}

const segment = (marker: number, body: Buffer) => Buffer.concat([Buffer.from([0xff, marker, (body.length + 2) >> 8, (body.length + 2) & 0xff]), body])

/** A JPEG-shaped file whose Exif segment carries a GPS position (`GPSLatitude`). */
export function jpegWithGps(): Buffer {
  return Buffer.concat([
    Buffer.from([0xff, 0xd8]),
    segment(0xe0, Buffer.from('JFIF\0\x01\x01\0\0\x01\0\x01\0\0', 'latin1')),
    segment(0xe1, Buffer.from('Exif\0\0GPSLatitude 51.5072 N GPSLongitude 0.1276 W', 'latin1')),
    segment(0xdb, Buffer.alloc(65, 1)),
    segment(0xda, Buffer.alloc(10, 2)),
    Buffer.from([0x12, 0x34, 0x56, 0xff, 0xd9]),
  ])
}

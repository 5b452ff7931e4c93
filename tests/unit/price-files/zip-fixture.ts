/**
 * Builds small zip files by hand (PKWARE APPNOTE.TXT 4.3: local headers, data, central directory, end
 * record) so tests can make honest zips and lying ones (sizes that understate, entries sharing bytes).
 */
import { deflateRawSync } from 'node:zlib'

export interface FixtureEntry {
  name: string
  data: Buffer
  /** override what the central directory declares */
  declaredSize?: number
  /** point this entry's central record at the local header of an earlier entry */
  shareWith?: number
  store?: boolean
}

function crc32(buf: Buffer): number {
  let c = ~0
  for (const b of buf) {
    c ^= b
    for (let k = 0; k < 8; k++) c = (c >>> 1) ^ (0xedb88320 & -(c & 1))
  }
  return ~c >>> 0
}

export function buildZip(entries: FixtureEntry[]): Buffer {
  const parts: Buffer[] = []
  const central: Buffer[] = []
  const offsets: number[] = []
  const sizes: number[] = []
  let offset = 0
  entries.forEach((e, i) => {
    const name = Buffer.from(e.name)
    const body = e.store ? e.data : deflateRawSync(e.data)
    const crc = crc32(e.data)
    if (e.shareWith === undefined) {
      const lh = Buffer.alloc(30)
      lh.writeUInt32LE(0x04034b50, 0); lh.writeUInt16LE(20, 4); lh.writeUInt16LE(0, 6); lh.writeUInt16LE(e.store ? 0 : 8, 8)
      lh.writeUInt32LE(crc, 14); lh.writeUInt32LE(body.length, 18); lh.writeUInt32LE(e.data.length, 22)
      lh.writeUInt16LE(name.length, 26); lh.writeUInt16LE(0, 28)
      offsets[i] = offset
      sizes[i] = body.length
      parts.push(lh, name, body)
      offset += 30 + name.length + body.length
    } else {
      offsets[i] = offsets[e.shareWith]!
      sizes[i] = sizes[e.shareWith]!
    }
    const ch = Buffer.alloc(46)
    ch.writeUInt32LE(0x02014b50, 0); ch.writeUInt16LE(20, 4); ch.writeUInt16LE(20, 6); ch.writeUInt16LE(0, 8)
    ch.writeUInt16LE(e.store ? 0 : 8, 10); ch.writeUInt32LE(crc, 16); ch.writeUInt32LE(sizes[i]!, 20)
    ch.writeUInt32LE(e.declaredSize ?? e.data.length, 24); ch.writeUInt16LE(name.length, 28)
    ch.writeUInt32LE(offsets[i]!, 42)
    central.push(ch, name)
  })
  const cd = Buffer.concat(central)
  const end = Buffer.alloc(22)
  end.writeUInt32LE(0x06054b50, 0); end.writeUInt16LE(entries.length, 8); end.writeUInt16LE(entries.length, 10)
  end.writeUInt32LE(cd.length, 12); end.writeUInt32LE(offset, 16)
  return Buffer.concat([...parts, cd, end])
}

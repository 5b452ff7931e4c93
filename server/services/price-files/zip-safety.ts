/**
 * Whether an XLSX (a zip) is safe to inflate: entry count and sizes from the central directory, refused before
 * anything is inflated, then the declared sizes proven while inflating once into nothing, and the first worksheet's
 * columns and rows counted on the way (sheet-shape.ts), before any reader walks its cells.
 */
import { createReadStream } from 'node:fs'
import { open, stat } from 'node:fs/promises'
import { createInflateRaw } from 'node:zlib'
import { Transform, type TransformCallback } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { PRICE_FILE_LIMITS } from '../../../shared/types/price-files'
import { PriceFileError } from './file-rows'
import { sheetShapeScan } from './sheet-shape'

export interface ZipEntry {
  name: string
  method: number
  flags: number
  compressedSize: number
  uncompressedSize: number
  localHeaderOffset: number
}

/**
 * Lists the entries of a zip from its central directory (APPNOTE.TXT 4.3.12 / 4.3.16) and refuses, before
 * anything is inflated: too many entries, too many inflated bytes in total, a suspicious compression ratio,
 * ZIP64, encryption, or entries whose data lie outside the file or overlap (the "overlapping files" bomb).
 */
export async function inspectZip(path: string, limits = PRICE_FILE_LIMITS): Promise<ZipEntry[]> {
  const { size } = await stat(path)
  const fh = await open(path, 'r')
  try {
    const tailLen = Math.min(size, 22 + 0xffff)
    const tail = Buffer.alloc(tailLen)
    await fh.read(tail, 0, tailLen, size - tailLen)
    let eocd = -1
    for (let i = tailLen - 22; i >= 0; i--) {
      if (tail.readUInt32LE(i) === 0x06054b50) { eocd = i; break }
    }
    if (eocd < 0) throw new PriceFileError('This XLSX file is damaged: its zip directory is missing.', 'damaged')
    const total = tail.readUInt16LE(eocd + 10)
    const cdSize = tail.readUInt32LE(eocd + 12)
    const cdOffset = tail.readUInt32LE(eocd + 16)
    if (total === 0xffff || cdSize === 0xffffffff || cdOffset === 0xffffffff) {
      throw new PriceFileError('This XLSX file uses ZIP64, which price files never need. Save it again from the spreadsheet program.', 'zip64')
    }
    if (total > limits.maxZipEntries) {
      throw new PriceFileError(`This XLSX file holds ${total} zip entries (at most ${limits.maxZipEntries} are accepted): it is not a plain workbook.`, 'zip_bomb')
    }
    if (cdOffset + cdSize > size) throw new PriceFileError('This XLSX file is damaged: its zip directory points outside the file.', 'damaged')
    const cd = Buffer.alloc(cdSize)
    await fh.read(cd, 0, cdSize, cdOffset)

    const entries: ZipEntry[] = []
    let p = 0
    let inflated = 0
    for (let n = 0; n < total; n++) {
      if (p + 46 > cd.length || cd.readUInt32LE(p) !== 0x02014b50) {
        throw new PriceFileError('This XLSX file is damaged: its zip directory is cut short.', 'damaged')
      }
      const e: ZipEntry = {
        flags: cd.readUInt16LE(p + 8),
        method: cd.readUInt16LE(p + 10),
        compressedSize: cd.readUInt32LE(p + 20),
        uncompressedSize: cd.readUInt32LE(p + 24),
        localHeaderOffset: cd.readUInt32LE(p + 42),
        name: '',
      }
      const nameLen = cd.readUInt16LE(p + 28)
      const extraLen = cd.readUInt16LE(p + 30)
      const commentLen = cd.readUInt16LE(p + 32)
      e.name = cd.toString('utf8', p + 46, p + 46 + nameLen)
      p += 46 + nameLen + extraLen + commentLen
      if (e.compressedSize === 0xffffffff || e.uncompressedSize === 0xffffffff || e.localHeaderOffset === 0xffffffff) {
        throw new PriceFileError('This XLSX file uses ZIP64, which price files never need. Save it again from the spreadsheet program.', 'zip64')
      }
      if (e.flags & 0x1) throw new PriceFileError('This XLSX file is password-protected. Save an unprotected copy and upload that.', 'encrypted')
      if (e.method !== 0 && e.method !== 8) throw new PriceFileError(`This XLSX file uses an unusual zip compression (method ${e.method}).`, 'damaged')
      if (e.method === 0 && e.compressedSize !== e.uncompressedSize) throw new PriceFileError('This XLSX file is damaged: a stored entry has two sizes.', 'damaged')
      inflated += e.uncompressedSize
      if (inflated > limits.maxZipInflatedBytes) {
        throw new PriceFileError(`This XLSX file would inflate to more than ${Math.round(limits.maxZipInflatedBytes / 1024 / 1024)} MB: refused as a possible zip bomb.`, 'zip_bomb')
      }
      if (e.uncompressedSize > 1024 * 1024 && e.uncompressedSize > e.compressedSize * limits.maxZipRatio) {
        throw new PriceFileError(`The entry “${e.name}” of this XLSX file inflates ${Math.round(e.uncompressedSize / Math.max(1, e.compressedSize))} times: refused as a possible zip bomb.`, 'zip_bomb')
      }
      entries.push(e)
    }

    // Each entry's data must sit inside the file, after its own local header, without overlapping another.
    const ranges: [number, number, string][] = []
    const lh = Buffer.alloc(30)
    for (const e of entries) {
      if (e.localHeaderOffset + 30 > cdOffset) throw new PriceFileError('This XLSX file is damaged: an entry lies outside the file.', 'damaged')
      await fh.read(lh, 0, 30, e.localHeaderOffset)
      if (lh.readUInt32LE(0) !== 0x04034b50) throw new PriceFileError('This XLSX file is damaged: an entry header is missing.', 'damaged')
      const start = e.localHeaderOffset + 30 + lh.readUInt16LE(26) + lh.readUInt16LE(28)
      const end = start + e.compressedSize
      if (end > cdOffset) throw new PriceFileError('This XLSX file is damaged: an entry runs past its end.', 'damaged')
      ranges.push([e.localHeaderOffset, end, e.name])
    }
    ranges.sort((a, b) => a[0] - b[0])
    for (let i = 1; i < ranges.length; i++) {
      if (ranges[i]![0] < ranges[i - 1]![1]) {
        throw new PriceFileError('Two entries of this XLSX file share the same bytes: refused as a possible zip bomb.', 'zip_bomb')
      }
    }
    return entries
  } finally {
    await fh.close()
  }
}

const WORKSHEET = /^xl\/worksheets\/[^/]+\.xml$/

/**
 * Inflates every entry once, discarding the output, and refuses the file as soon as an entry yields more
 * bytes than the directory declared: the declared sizes checked above are then true, whatever a crafted
 * file claims. The first worksheet in the file (the one read) is scanned for a cell beyond the column limit or
 * too many rows on the way. Runs on streams (constant memory) and stops at the first excess.
 */
export async function proveZipSizes(path: string, entries: ZipEntry[]): Promise<void> {
  const fh = await open(path, 'r')
  const lh = Buffer.alloc(30)
  const firstSheet = entries.filter((e) => WORKSHEET.test(e.name)).sort((a, b) => a.localHeaderOffset - b.localHeaderOffset)[0]
  try {
    for (const e of entries) {
      const shape = e === firstSheet ? sheetShapeScan() : null
      // a stored entry has nothing to prove, but a stored first worksheet is still scanned
      if (e.compressedSize === 0 || (e.method !== 8 && !shape)) continue
      await fh.read(lh, 0, 30, e.localHeaderOffset)
      const start = e.localHeaderOffset + 30 + lh.readUInt16LE(26) + lh.readUInt16LE(28)
      let produced = 0
      const counter = new Transform({
        transform(chunk: Buffer, _enc, cb: TransformCallback) {
          produced += chunk.length
          if (produced > e.uncompressedSize) return cb(new PriceFileError(`The entry “${e.name}” of this XLSX file inflates beyond its declared size: refused as a possible zip bomb.`, 'zip_bomb'))
          try {
            shape?.push(chunk)
          } catch (err) {
            return cb(err as Error)
          }
          cb()
        },
      })
      try {
        const raw = createReadStream(path, { start, end: start + e.compressedSize - 1 })
        await (e.method === 8 ? pipeline(raw, createInflateRaw(), counter) : pipeline(raw, counter))
      } catch (err) {
        if (err instanceof PriceFileError) throw err
        throw new PriceFileError(`This XLSX file is damaged: the entry “${e.name}” cannot be inflated.`, 'damaged')
      }
    }
  } finally {
    await fh.close()
  }
}

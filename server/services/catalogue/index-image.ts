/**
 * Part search: the built index as a file of named sections (typed arrays, string lists, text), so a process can
 * load it instead of building it from the database. Layout: a lead of {@link LEAD} bytes ("BLSI", the format number,
 * where the header starts and its length, little-endian), the sections, each starting on a multiple of 8 bytes, then
 * the header (JSON: what the index was built from and where each section lies). The header comes last so the file
 * is written as the sections are made, one at a time (the writer never holds them all), and the lead, which points
 * at it, is written once it is known. Numbers are stored little-endian, as the machines it runs on hold them (a
 * file written elsewhere is refused). Pure apart from the two file functions at the end.
 */
import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs'
import { open } from 'node:fs/promises'
import os from 'node:os'

export type Section = Int32Array | Uint8Array | Float64Array | string[] | string
/** The named sections of an index, in any order. */
export type Sections = Map<string, Section>
/** Sections as they are made, each produced when the writer asks for the next (so the previous one can go). */
export type SectionStream = Iterable<[name: string, value: Section]>
/** Sections as read back: each decoded when asked for (from the file: read then), and not kept. */
export interface SectionSource { names(): string[]; get(name: string): Section | undefined | Promise<Section | undefined> }

const MAGIC = 'BLSI'
/**
 * 2: the header after the sections (1 had it first: a file of format 1 is refused, and the index built and saved
 * again).
 */
const FORMAT = 2
/** "BLSI", format (uint32), header offset (48-bit), 2 bytes unused, header length (uint32), 4 bytes unused: a multiple of 8. */
const LEAD = 24
/** Never in a key, word or fitting key (identifiers are letters and digits, JSON escapes control characters). */
const SEP = '\u0000'

interface SectionRef { name: string; kind: 'i32' | 'u8' | 'f64' | 'strs' | 'str'; offset: number; bytes: number; count: number }
interface Header<M> { format: number; meta: M; sections: SectionRef[] }

const pad8 = (n: number) => (8 - (n % 8)) % 8
const ZEROS = Buffer.alloc(8)

function encodeSection(name: string, value: Section): { ref: Omit<SectionRef, 'offset'>; bytes: Buffer } {
  if (typeof value === 'string') {
    const bytes = Buffer.from(value, 'utf8')
    return { ref: { name, kind: 'str', bytes: bytes.length, count: value.length }, bytes }
  }
  if (Array.isArray(value)) {
    const bytes = Buffer.from(value.join(SEP), 'utf8')
    return { ref: { name, kind: 'strs', bytes: bytes.length, count: value.length }, bytes }
  }
  const kind = value instanceof Int32Array ? 'i32' : value instanceof Float64Array ? 'f64' : 'u8'
  const bytes = Buffer.from(value.buffer, value.byteOffset, value.byteLength)
  return { ref: { name, kind, bytes: bytes.length, count: value.length }, bytes }
}

/**
 * Writes the image through `put` (bytes at a position): the lead's place first (zeros), each section as it comes
 * (encoded, written, dropped before the next is asked for), the header, then the lead over its place.
 */
function writeImage<M>(meta: M, sections: SectionStream, put: (bytes: Buffer, position: number) => void): void {
  if (os.endianness() !== 'LE') throw new Error('part search index files are written on little-endian machines only')
  put(Buffer.alloc(LEAD), 0)
  let at = LEAD
  const refs: SectionRef[] = []
  for (const [name, value] of sections) {
    const { ref, bytes } = encodeSection(name, value)
    refs.push({ ...ref, offset: at })
    put(bytes, at)
    put(ZEROS.subarray(0, pad8(bytes.length)), at + bytes.length)
    at += bytes.length + pad8(bytes.length)
  }
  const header = Buffer.from(JSON.stringify({ format: FORMAT, meta, sections: refs } satisfies Header<M>), 'utf8')
  put(header, at)
  const lead = Buffer.alloc(LEAD)
  lead.write(MAGIC, 0, 'latin1')
  lead.writeUInt32LE(FORMAT, 4)
  lead.writeUIntLE(at, 8, 6)
  lead.writeUInt32LE(header.length, 16)
  put(lead, 0)
}

/** The file's bytes as a list of buffers (written one after the other). */
export function encodeImage<M>(meta: M, sections: Sections | SectionStream): Buffer[] {
  const out: Buffer[] = []
  writeImage(meta, sections, (bytes, position) => {
    if (position === 0 && out.length) out[0] = bytes // the lead, once the header is placed
    else out.push(bytes)
  })
  return out
}

/** Where the header lies, from the lead, or null when the bytes are not the lead of an index file of this format. */
function leadOf(lead: Buffer, size: number): { at: number; length: number } | null {
  if (lead.length < LEAD || lead.toString('latin1', 0, 4) !== MAGIC || lead.readUInt32LE(4) !== FORMAT) return null
  const at = lead.readUIntLE(8, 6), length = lead.readUInt32LE(16)
  return at >= LEAD && at + length <= size ? { at, length } : null
}

/** The header from its bytes, or null when its sections do not all lie within the file's `size` bytes. */
function headerOf<M>(bytes: Buffer, at: number, size: number): Header<M> | null {
  const header = JSON.parse(bytes.toString('utf8')) as Header<M>
  return header.format === FORMAT && header.sections.every((r) => r.offset >= LEAD && r.offset + r.bytes <= at && at <= size) ? header : null
}

/**
 * The sections back from the file's bytes, each decoded when first asked for (typed arrays are copies, so the file's
 * buffer can go): a loader that takes them one at a time never holds every decoded section, or every text index's
 * JSON, at once. Null when the bytes are not an index file of this format.
 */
export function decodeImage<M>(buf: Buffer): { meta: M; sections: SectionSource } | null {
  const l = leadOf(buf, buf.length)
  const header = l ? headerOf<M>(buf.subarray(l.at, l.at + l.length), l.at, buf.length) : null
  if (!header) return null
  const refs = new Map(header.sections.map((r) => [r.name, r]))
  const decode = (r: SectionRef): Section => {
    const b = new ArrayBuffer(r.bytes)
    new Uint8Array(b).set(buf.subarray(r.offset, r.offset + r.bytes))
    return sectionOf(r, b)
  }
  return {
    meta: header.meta,
    sections: { names: () => [...refs.keys()], get: (name) => { const r = refs.get(name); return r ? decode(r) : undefined } },
  }
}

/** A section's value from its own bytes (typed arrays keep `bytes` as their buffer: no copy). */
function sectionOf(r: SectionRef, bytes: ArrayBuffer): Section {
  if (r.kind === 'str') return Buffer.from(bytes).toString('utf8')
  if (r.kind === 'strs') return r.count === 0 ? [] : Buffer.from(bytes).toString('utf8').split(SEP)
  if (r.kind === 'i32') return new Int32Array(bytes)
  if (r.kind === 'f64') return new Float64Array(bytes)
  return new Uint8Array(bytes)
}

/** A saved index file opened for reading section by section; `close` when done. */
export interface OpenImage<M> { meta: M; sections: SectionSource; close(): Promise<void> }

/**
 * Opens a saved index file and reads its header only; each section is read from its place in the file when asked
 * for (into a buffer of its own, which typed arrays keep), so the whole file is never in memory at once and the
 * reads wait on the disk without holding the event loop. Null when there is no file or it is not of this format.
 */
export async function openImageFile<M>(path: string): Promise<OpenImage<M> | null> {
  let file
  try { file = await open(path, 'r') } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null
    throw err
  }
  try {
    const read = async (position: number, length: number) => {
      const b = new ArrayBuffer(length)
      const view = new Uint8Array(b)
      for (let done = 0; done < length;) {
        const { bytesRead } = await file.read(view, done, length - done, position + done)
        if (!bytesRead) throw new Error('part search index file: shorter than its header says')
        done += bytesRead
      }
      return b
    }
    const size = (await file.stat()).size
    const lead = Buffer.alloc(LEAD)
    const { bytesRead } = await file.read(lead, 0, LEAD, 0)
    const l = bytesRead === LEAD ? leadOf(lead, size) : null
    const header = l ? headerOf<M>(Buffer.from(await read(l.at, l.length)), l.at, size) : null
    if (!header) { await file.close(); return null }
    const refs = new Map(header.sections.map((r) => [r.name, r]))
    return {
      meta: header.meta,
      sections: {
        names: () => [...refs.keys()],
        get: async (name) => { const r = refs.get(name); return r ? sectionOf(r, await read(r.offset, r.bytes)) : undefined },
      },
      close: () => file.close(),
    }
  } catch (err) {
    await file.close()
    throw err
  }
}

/**
 * Writes the file whole or not at all: to a temporary name beside it, then renamed over the old one. Each section
 * is asked for, encoded and written before the next, so only one is held at a time.
 */
export function writeImageFile<M>(path: string, meta: M, sections: Sections | SectionStream): void {
  const tmp = `${path}.${process.pid}.tmp`
  const fd = openSync(tmp, 'w')
  try {
    try {
      writeImage(meta, sections, (b, position) => {
        for (let done = 0; done < b.length;) done += writeSync(fd, b, done, b.length - done, position + done)
      })
      fsyncSync(fd)
    } finally { closeSync(fd) }
    renameSync(tmp, path)
  } catch (err) {
    rmSync(tmp, { force: true })
    throw err
  }
}

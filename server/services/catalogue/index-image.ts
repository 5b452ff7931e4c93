/**
 * Part search: the built index as a file of named sections (typed arrays, string lists, text), so a process can
 * load it instead of building it from the database. Layout: "BLSI", a format number and the header's length
 * (uint32 little-endian), the header (JSON: what the index was built from and where each section lies), then the
 * sections, each starting on a multiple of 8 bytes. Numbers are stored little-endian, as the machines it runs on
 * hold them (a file written elsewhere is refused). Pure apart from the two file functions at the end.
 */
import { closeSync, fsyncSync, openSync, renameSync, writeSync } from 'node:fs'
import { open } from 'node:fs/promises'
import os from 'node:os'

export type Section = Int32Array | Uint8Array | Float64Array | string[] | string
/** The named sections of an index, in any order. */
export type Sections = Map<string, Section>
/** Sections as read back: each decoded when asked for (from the file: read then), and not kept. */
export interface SectionSource { names(): string[]; get(name: string): Section | undefined | Promise<Section | undefined> }

const MAGIC = 'BLSI'
const FORMAT = 1
/** Never in a key, word or fitting key (identifiers are letters and digits, JSON escapes control characters). */
const SEP = '\u0000'

interface SectionRef { name: string; kind: 'i32' | 'u8' | 'f64' | 'strs' | 'str'; offset: number; bytes: number; count: number }
interface Header<M> { format: number; meta: M; sections: SectionRef[] }

const pad8 = (n: number) => (8 - (n % 8)) % 8

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

/** The file's bytes as a list of buffers (written one after the other). */
export function encodeImage<M>(meta: M, sections: Sections): Buffer[] {
  if (os.endianness() !== 'LE') throw new Error('part search index files are written on little-endian machines only')
  const parts = [...sections].map(([name, value]) => encodeSection(name, value))
  let offset = 0
  const refs: SectionRef[] = parts.map(({ ref, bytes }) => {
    const r = { ...ref, offset }
    offset += bytes.length + pad8(bytes.length)
    return r
  })
  const header = Buffer.from(JSON.stringify({ format: FORMAT, meta, sections: refs } satisfies Header<M>), 'utf8')
  const lead = Buffer.alloc(12)
  lead.write(MAGIC, 0, 'latin1')
  lead.writeUInt32LE(FORMAT, 4)
  lead.writeUInt32LE(header.length, 8)
  const out: Buffer[] = [lead, header, Buffer.alloc(pad8(12 + header.length))]
  for (const { bytes } of parts) out.push(bytes, Buffer.alloc(pad8(bytes.length)))
  return out
}

/** Reads the header only (what the index was built from), or null when the bytes are not an index file of this format. */
function headerOf<M>(buf: Buffer): { header: Header<M>; start: number } | null {
  if (buf.length < 12 || buf.toString('latin1', 0, 4) !== MAGIC || buf.readUInt32LE(4) !== FORMAT) return null
  const len = buf.readUInt32LE(8)
  if (12 + len > buf.length) return null
  const header = JSON.parse(buf.toString('utf8', 12, 12 + len)) as Header<M>
  return { header, start: 12 + len + pad8(12 + len) }
}

/**
 * The sections back from the file's bytes, each decoded when first asked for (typed arrays are copies, so the file's
 * buffer can go): a loader that takes them one at a time never holds every decoded section, or every text index's
 * JSON, at once.
 */
export function decodeImage<M>(buf: Buffer): { meta: M; sections: SectionSource } | null {
  const h = headerOf<M>(buf)
  if (!h) return null
  if (h.header.sections.some((r) => h.start + r.offset + r.bytes > buf.length)) return null
  const refs = new Map(h.header.sections.map((r) => [r.name, r]))
  const decode = (r: SectionRef): Section => {
    const at = h.start + r.offset
    const b = new ArrayBuffer(r.bytes)
    new Uint8Array(b).set(buf.subarray(at, at + r.bytes))
    return sectionOf(r, b)
  }
  return {
    meta: h.header.meta,
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
    const lead = Buffer.alloc(12)
    await file.read(lead, 0, 12, 0)
    const len = lead.toString('latin1', 0, 4) === MAGIC && lead.readUInt32LE(4) === FORMAT ? lead.readUInt32LE(8) : -1
    const h = len >= 0 && 12 + len <= size ? headerOf<M>(Buffer.concat([lead, Buffer.from(await read(12, len))])) : null
    if (!h || h.header.sections.some((r) => h.start + r.offset + r.bytes > size)) { await file.close(); return null }
    const refs = new Map(h.header.sections.map((r) => [r.name, r]))
    return {
      meta: h.header.meta,
      sections: {
        names: () => [...refs.keys()],
        get: async (name) => { const r = refs.get(name); return r ? sectionOf(r, await read(h.start + r.offset, r.bytes)) : undefined },
      },
      close: () => file.close(),
    }
  } catch (err) {
    await file.close()
    throw err
  }
}

/** Writes the file whole or not at all: to a temporary name beside it, then renamed over the old one. */
export function writeImageFile(path: string, buffers: Buffer[]): void {
  const tmp = `${path}.${process.pid}.tmp`
  const fd = openSync(tmp, 'w')
  try {
    for (const b of buffers) for (let done = 0; done < b.length;) done += writeSync(fd, b, done, b.length - done)
    fsyncSync(fd)
  } finally { closeSync(fd) }
  renameSync(tmp, path)
}


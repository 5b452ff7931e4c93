/**
 * The compared catalogue's SKU lookup (upper-cased SKU -> slot) without a string per part: the keys' characters one
 * after another in one byte buffer (a slot's key between `starts[slot]` and `starts[slot + 1]`) and an open-addressing
 * hash table of slots over them. At a million parts about 23 MB, against ~70 MB of heap for a `Map` of a million
 * strings and an array of the SKUs as written (measured after a full collection). A SKU that the buffer cannot hold
 * as it is (a character above U+00FF, or written other than in capitals) keeps its strings in two small maps beside
 * it. Pure: no I/O.
 *
 * Written here rather than taken from a package: what is needed is a string-keyed table whose keys are not held as
 * JavaScript strings, which the general-purpose hash maps on npm do not offer.
 */
export class SkuSlots {
  private bytes = new Uint8Array(1 << 16)
  private used = 0
  /** `bytes` as a Buffer, to decode a key (made again when `bytes` is) */
  private view = Buffer.alloc(0)
  private starts = new Int32Array(1025)
  private table = new Int32Array(2048) // slot + 1, 0 = empty
  private filled = 0
  /** keys the buffer does not hold (a character above U+00FF) */
  private readonly wide = new Map<string, number>()
  /** SKUs the buffer does not give back as written (not in capitals, or a key in `wide`) */
  private readonly written = new Map<number, string>()
  size = 0

  /** Adds the next slot's SKU; a key seen before now answers this slot (as a `Map.set` would). */
  add(sku: string): number {
    const key = sku.toUpperCase()
    const slot = this.size++
    if (slot + 2 > this.starts.length) this.starts = grown(this.starts, 2 * this.starts.length)
    if (!fitsBytes(key)) {
      this.written.set(slot, sku)
      this.starts[slot + 1] = this.used
      this.wide.set(key, slot)
      return slot
    }
    if (key !== sku) this.written.set(slot, sku)
    if (this.used + key.length > this.bytes.length) this.bytes = grown(this.bytes, Math.max(2 * this.bytes.length, this.used + key.length))
    for (let j = 0; j < key.length; j++) this.bytes[this.used + j] = key.charCodeAt(j)
    this.used += key.length
    this.starts[slot + 1] = this.used
    const at = this.probe(key)
    if (this.table[at] === 0) {
      if (2 * ++this.filled > this.table.length) { this.table[at] = slot + 1; this.rehash(); return slot }
    }
    this.table[at] = slot + 1
    return slot
  }

  /** The slot of an upper-cased SKU. */
  get(key: string): number | undefined {
    if (!fitsBytes(key)) return this.wide.get(key)
    const s = this.table[this.probe(key)]!
    return s === 0 ? undefined : s - 1
  }

  /** The SKU of a slot, as written. */
  sku(slot: number): string {
    const w = this.written.get(slot)
    if (w !== undefined) return w
    // Node's latin1 decoding gives byte b as U+00bb, as String.fromCharCode would (several times faster)
    if (this.view.buffer !== this.bytes.buffer) this.view = Buffer.from(this.bytes.buffer, this.bytes.byteOffset, this.bytes.byteLength)
    return this.view.toString('latin1', this.starts[slot]!, this.starts[slot + 1]!)
  }

  /** Gives back the room left over from growing, once every part is in. */
  trim(): void {
    this.bytes = this.bytes.slice(0, this.used)
    this.starts = this.starts.slice(0, this.size + 1)
  }

  /** Where `key` is in the table, or the empty place it would go. */
  private probe(key: string): number {
    const mask = this.table.length - 1
    let h = 0x811c9dc5 // FNV-1a, 32 bits
    for (let j = 0; j < key.length; j++) h = Math.imul(h ^ key.charCodeAt(j), 0x01000193)
    for (let at = h & mask; ; at = (at + 1) & mask) {
      const s = this.table[at]!
      if (s === 0 || this.keyIs(s - 1, key)) return at
    }
  }

  private keyIs(slot: number, key: string): boolean {
    const from = this.starts[slot]!
    if (this.starts[slot + 1]! - from !== key.length) return false
    for (let j = 0; j < key.length; j++) if (this.bytes[from + j] !== key.charCodeAt(j)) return false
    return true
  }

  private rehash(): void {
    const old = this.table
    this.table = new Int32Array(2 * old.length)
    const mask = this.table.length - 1
    for (const s of old) {
      if (s === 0) continue
      let h = 0x811c9dc5
      const from = this.starts[s - 1]!, to = this.starts[s]!
      for (let j = from; j < to; j++) h = Math.imul(h ^ this.bytes[j]!, 0x01000193)
      let at = h & mask
      while (this.table[at] !== 0) at = (at + 1) & mask
      this.table[at] = s
    }
  }
}

function fitsBytes(key: string): boolean {
  for (let j = 0; j < key.length; j++) if (key.charCodeAt(j) > 0xff) return false
  return true
}

function grown<T extends Uint8Array | Int32Array>(a: T, len: number): T {
  const b = new (a.constructor as new (n: number) => T)(len)
  b.set(a)
  return b
}

/**
 * Part search: the identifiers of every part (SKU, the SKU's digits, OE numbers, superseded SKUs) in one sorted
 * array. Exact and prefix lookups are binary searches, and a typo (one wrong, missing, extra or swapped character)
 * is found by looking up the few hundred one-slip variants of what was typed. Identifiers never enter the text
 * index, where 600k unique terms would cost hundreds of megabytes. Pure: no I/O.
 */

/** Lower-case letters and digits: how identifiers are compared inside the index. */
export const norm = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '')

/** What an identifier is to its part; the order is also the order exact matches of one key rank in. */
export const ID_KIND = { sku: 0, superseded: 1, oe: 2, skuDigits: 3 } as const

/** One identifier: its normalised key, the part's slot in the index and its {@link ID_KIND}. */
export type IdEntry = [key: string, slot: number, kind: number]

const ALPHABET = 'abcdefghijklmnopqrstuvwxyz0123456789'

/**
 * How likely a slip is, lower first. Transposed neighbours and a key next to the right one are the commonest
 * single-character typing errors (Damerau 1964; Kernighan, Church & Gale 1990 weight substitutions by keyboard
 * nearness), then a doubled character dropped or added, then any other. A wrong key that does not touch the right
 * one costs more the further away it is ({@link substitutionCost}), between `neighbour` and `other`.
 */
export const SLIP = { swap: 0, neighbour: 1, doubled: 2, other: 3 } as const

type At = [row: number, col: number]
/** Key centres in key widths: the top row of digits, and the numeric keypad (7 8 9 / 4 5 6 / 1 2 3 / wide 0). */
const TOP_ROW = new Map<string, At[]>([...'1234567890'].map((ch, i) => [ch, [[0, i]]]))
const KEYPAD = new Map<string, At[]>([
  ...['789', '456', '123'].flatMap((row, r) => [...row].map((ch, c): [string, At[]] => [ch, [[r, c]]])),
  ['0', [[3, 0], [3, 1]]], // the 0 key is two keys wide
])
/** Letters, QWERTY, each row set half a key right of the one above (so a key touches two in the next row). */
const LETTERS = new Map<string, At[]>(['qwertyuiop', 'asdfghjkl', 'zxcvbnm'].flatMap((row, r) => [...row].map((ch, c): [string, At[]] => [ch, [[r, c + r / 2]]])))

function distanceOn(layout: Map<string, At[]>, a: string, b: string): number {
  const p = layout.get(a), q = layout.get(b)
  if (!p || !q) return Infinity
  let d = Infinity
  for (const [r1, c1] of p) for (const [r2, c2] of q) d = Math.min(d, Math.hypot(r1 - r2, c1 - c2))
  return d
}

/**
 * How far apart two keys are, in key widths, on the layout where they are nearest: digits on the top row or the
 * numeric keypad (either may be used at a counter), letters on QWERTY; Infinity between a letter and a digit.
 */
export function keyDistance(a: string, b: string): number {
  return Math.min(distanceOn(TOP_ROW, a, b), distanceOn(KEYPAD, a, b), distanceOn(LETTERS, a, b))
}

/** Whether two keys touch: side by side (1 key width) or in the next letter row (half a key across, about 1.12). */
export function isNeighbourKey(a: string, b: string): boolean {
  return a !== b && keyDistance(a, b) <= 1.2
}

/**
 * The cost of typing `b` for `a`: a touching key is a neighbour slip; a key further off costs more with its distance
 * (a keypad diagonal, 1.41 key widths, about 1.7; two keys away 2; three or more, or a letter for a digit, 3).
 */
export function substitutionCost(a: string, b: string): number {
  const d = keyDistance(a, b)
  if (d <= 1.2) return SLIP.neighbour
  return Math.min(SLIP.other, 1 + d / 2)
}

/** The table as saved: the keys' bytes one after another, where each starts (one more than entries), slots, kinds. */
export interface IdentifierImage { bytes: Uint8Array; starts: Int32Array; slots: Int32Array; kinds: Uint8Array }

const byKeyThenKind = (a: IdEntry, b: IdEntry) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : a[2] - b[2] || a[1] - b[1])

/**
 * The sorted identifiers; lookups answer entry numbers, read back with {@link key}, {@link slot}, {@link kind}.
 * The keys (letters and digits only, so one byte a character and byte order is string order) live in one buffer
 * with typed arrays beside it: 3.5 million identifiers at a million parts take about 70 MB this way, against
 * about 200 MB as strings in arrays.
 */
export class IdentifierTable {
  private bytes: Uint8Array = new Uint8Array(0)
  private starts: Uint32Array = new Uint32Array(1)
  private slots: Int32Array = new Int32Array(0)
  private kinds: Uint8Array = new Uint8Array(0)
  /**
   * Entries staged for {@link commit}, in the table's own shape (keys' bytes one after another, where each starts,
   * slots, kinds; `n` used, with room to grow) rather than a string and an array per entry: at a million parts 3.5
   * million of those would cost ~300 MB more while the index is built.
   */
  private pending: { bytes: Uint8Array; starts: Uint32Array; slots: Int32Array; kinds: Uint8Array; n: number } | null = null

  get size(): number { return this.slots.length }
  key(entry: number): string { return Buffer.from(this.bytes.buffer, this.bytes.byteOffset, this.bytes.byteLength).toString('latin1', this.starts[entry]!, this.starts[entry + 1]!) }
  slot(entry: number): number { return this.slots[entry]! }
  kind(entry: number): number { return this.kinds[entry]! }

  /** The sorted entries as they are, for a saved index ({@link fromImage} takes them back). */
  image(): IdentifierImage {
    if (this.pending) throw new Error('identifier table: commit staged entries before saving')
    return { bytes: this.bytes, starts: new Int32Array(this.starts.buffer, this.starts.byteOffset, this.starts.length), slots: this.slots, kinds: this.kinds }
  }

  static fromImage(img: IdentifierImage): IdentifierTable {
    const t = new IdentifierTable()
    t.bytes = img.bytes
    t.starts = new Uint32Array(img.starts.buffer, img.starts.byteOffset, img.starts.length)
    t.slots = img.slots
    t.kinds = img.kinds
    return t
  }

  /** Bulk load, step 1: entries wait unsorted until {@link commit}. Keys are letters and digits ({@link norm}). */
  stage(entries: IdEntry[]): void {
    let p = this.pending
    let bytes = 0
    for (const e of entries) bytes += e[0].length
    if (!p || p.n + entries.length > p.slots.length || p.starts[p.n]! + bytes > p.bytes.length) {
      const n = p?.n ?? 0, size = Math.ceil((n + entries.length) * 1.5) + 1024
      const next = {
        bytes: new Uint8Array(Math.ceil(((p?.starts[n] ?? 0) + bytes) * 1.5) + 16384), starts: new Uint32Array(size + 1),
        slots: new Int32Array(size), kinds: new Uint8Array(size), n,
      }
      if (p) {
        next.bytes.set(p.bytes.subarray(0, p.starts[n]!))
        next.starts.set(p.starts.subarray(0, n + 1))
        next.slots.set(p.slots.subarray(0, n))
        next.kinds.set(p.kinds.subarray(0, n))
      }
      this.pending = p = next
    }
    for (const [key, slot, kind] of entries) {
      let at = p.starts[p.n]!
      for (let c = 0; c < key.length; c++) p.bytes[at++] = key.charCodeAt(c)
      p.slots[p.n] = slot
      p.kinds[p.n] = kind
      p.starts[++p.n] = at
    }
  }

  /** Bulk load, step 2: sorts the staged entries in with the others (by key, then kind). */
  commit(): void {
    const p = this.pending
    this.pending = null
    if (!p?.n) return
    // sorted as entry numbers (by key, then kind, then slot, as `replace` sorts), comparing the keys' bytes (byte
    // order is string order for letters and digits)
    const { bytes, starts, slots, kinds, n } = p
    const order = new Uint32Array(n)
    for (let i = 0; i < n; i++) order[i] = i
    order.sort((a, b) => {
      const ea = starts[a + 1]!, eb = starts[b + 1]!
      for (let i = starts[a]!, j = starts[b]!; i < ea && j < eb; i++, j++) { const d = bytes[i]! - bytes[j]!; if (d) return d }
      return ea - starts[a]! - (eb - starts[b]!) || kinds[a]! - kinds[b]! || slots[a]! - slots[b]!
    })
    if (this.size) {
      const key = (j: number) => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('latin1', starts[order[j]!]!, starts[order[j]! + 1]!)
      this.merge(new Set(), n, key, (j) => slots[order[j]!]!, (j) => kinds[order[j]!]!)
      return
    }
    // an empty table (a build): the staged entries, in their order, are the table
    const out = new Uint8Array(starts[n]!), outStarts = new Uint32Array(n + 1), outSlots = new Int32Array(n), outKinds = new Uint8Array(n)
    let pos = 0
    for (let j = 0; j < n; j++) {
      const e = order[j]!, end = starts[e + 1]!
      outStarts[j] = pos
      for (let i = starts[e]!; i < end; i++) out[pos++] = bytes[i]!
      outSlots[j] = slots[e]!
      outKinds[j] = kinds[e]!
    }
    outStarts[n] = pos
    this.bytes = out
    this.starts = outStarts
    this.slots = outSlots
    this.kinds = outKinds
  }

  /** Compares entry `i`'s key with `key` (negative: the entry sorts first). */
  private cmp(i: number, key: string): number {
    const a = this.starts[i]!, n = this.starts[i + 1]! - a, m = key.length
    for (let k = 0; k < n && k < m; k++) {
      const d = this.bytes[a + k]! - key.charCodeAt(k)
      if (d) return d
    }
    return n - m
  }

  /**
   * Drops every entry of these part slots and merges `entries` into their sorted places (by key, then kind), in
   * one pass over the table however many parts changed (the kept keys are copied in runs).
   */
  replace(removedSlots: ReadonlySet<number>, entries: IdEntry[]): void {
    const add = [...entries].sort(byKeyThenKind)
    this.merge(removedSlots, add.length, (j) => add[j]![0], (j) => add[j]![1], (j) => add[j]![2])
  }

  /** {@link replace} with the `count` entries to add given, sorted, by their key, slot and kind at 0..count-1. */
  private merge(removedSlots: ReadonlySet<number>, count: number, keyAt: (j: number) => string, slotAt: (j: number) => number, kindAt: (j: number) => number): void {
    if (!removedSlots.size && !count) return
    const n = this.size
    const size = n + count
    let addBytes = 0
    for (let j = 0; j < count; j++) addBytes += keyAt(j).length
    const out = Buffer.allocUnsafe(this.bytes.length + addBytes)
    const src = Buffer.from(this.bytes.buffer, this.bytes.byteOffset, this.bytes.byteLength)
    const starts = new Uint32Array(size + 1), slots = new Int32Array(size), kinds = new Uint8Array(size)
    let o = 0, pos = 0, j = 0
    let runFrom = -1, runOut = 0
    const flush = (to: number) => {
      if (runFrom < 0) return
      src.copy(out, runOut, runFrom, to)
      pos = runOut + (to - runFrom)
      runFrom = -1
    }
    const putAdded = () => {
      starts[o] = pos
      pos += out.write(keyAt(j), pos, 'latin1')
      slots[o] = slotAt(j)
      kinds[o++] = kindAt(j++)
    }
    for (let i = 0; i < n; i++) {
      while (j < count) {
        const c = this.cmp(i, keyAt(j))
        if (c < 0 || (c === 0 && kindAt(j) >= this.kinds[i]!)) break
        flush(this.starts[i]!)
        putAdded()
      }
      if (removedSlots.has(this.slots[i]!)) { flush(this.starts[i]!); continue }
      if (runFrom < 0) { runFrom = this.starts[i]!; runOut = pos }
      starts[o] = runOut + (this.starts[i]! - runFrom)
      slots[o] = this.slots[i]!
      kinds[o++] = this.kinds[i]!
    }
    flush(this.starts[n]!)
    while (j < count) putAdded()
    starts[o] = pos
    this.bytes = new Uint8Array(out.buffer, out.byteOffset, pos)
    // cut to size only when entries were dropped (a copy of each, ~30 MB at a million parts)
    this.starts = o === size ? starts : starts.slice(0, o + 1)
    this.slots = o === size ? slots : slots.slice(0, o)
    this.kinds = o === size ? kinds : kinds.slice(0, o)
  }

  private lowerBound(key: string): number {
    let lo = 0, hi = this.size
    while (lo < hi) { const mid = (lo + hi) >>> 1; if (this.cmp(mid, key) < 0) lo = mid + 1; else hi = mid }
    return lo
  }

  /** Entries with exactly this key. */
  exact(key: string): number[] {
    const out: number[] = []
    for (let i = this.lowerBound(key); i < this.size && this.cmp(i, key) === 0; i++) out.push(i)
    return out
  }

  /** Entries one slip away (Damerau: one substitution, deletion, insertion or swap of neighbours). */
  oneSlip(key: string): number[] {
    return this.oneSlipRanked(key).map((x) => x.entry)
  }

  /**
   * Entries one slip away, the likeliest slips first ({@link slipCost}): with part numbers handed out in sequence,
   * most one-slip variants of a number are other real parts, so which slip is likelier decides what is shown.
   */
  oneSlipRanked(key: string): { entry: number; cost: number }[] {
    const variants = new Map<string, number>()
    const add = (v: string, cost: number) => {
      const before = variants.get(v)
      if (v !== key && (before === undefined || cost < before)) variants.set(v, cost)
    }
    for (let i = 0; i < key.length; i++) {
      const c = key[i]!
      // missing character: a doubled one dropped is the commonest kind
      add(key.slice(0, i) + key.slice(i + 1), c === key[i - 1] || c === key[i + 1] ? SLIP.doubled : SLIP.other)
      if (i + 1 < key.length) add(key.slice(0, i) + key[i + 1] + c + key.slice(i + 2), SLIP.swap)
      for (const x of ALPHABET) if (x !== c) add(key.slice(0, i) + x + key.slice(i + 1), substitutionCost(c, x))
    }
    for (let i = 0; i <= key.length; i++) {
      for (const x of ALPHABET) add(key.slice(0, i) + x + key.slice(i), x === key[i - 1] || x === key[i] ? SLIP.doubled : SLIP.other)
    }
    const out: { entry: number; cost: number }[] = []
    for (const [v, cost] of variants) for (const entry of this.exact(v)) out.push({ entry, cost })
    return out.sort((a, b) => a.cost - b.cost || a.entry - b.entry)
  }

  /** Entries whose key starts with `key` (not equal to it), at most `limit`. */
  prefixed(key: string, limit: number): number[] {
    const out: number[] = []
    for (let i = this.lowerBound(key); i < this.size && out.length < limit; i++) {
      const len = this.starts[i + 1]! - this.starts[i]!
      if (len < key.length || this.cmpPrefix(i, key) !== 0) break
      if (len !== key.length) out.push(i)
    }
    return out
  }

  /** Compares the first `key.length` characters of entry `i` with `key` (the entry is at least that long). */
  private cmpPrefix(i: number, key: string): number {
    const a = this.starts[i]!
    for (let k = 0; k < key.length; k++) {
      const d = this.bytes[a + k]! - key.charCodeAt(k)
      if (d) return d
    }
    return 0
  }
}

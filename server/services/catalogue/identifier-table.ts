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

/** The sorted identifiers; lookups answer entry numbers, read back with {@link key}, {@link slot}, {@link kind}. */
export class IdentifierTable {
  private keys: string[] = []
  private slots: number[] = []
  private kinds: number[] = []
  private pending: { keys: string[]; slots: number[]; kinds: number[] } | null = null

  key(entry: number): string { return this.keys[entry]! }
  slot(entry: number): number { return this.slots[entry]! }
  kind(entry: number): number { return this.kinds[entry]! }

  /** Bulk load, step 1: entries wait unsorted until {@link commit}. */
  stage(entries: IdEntry[]): void {
    this.pending ??= { keys: [], slots: [], kinds: [] }
    for (const [k, sl, kind] of entries) { this.pending.keys.push(k); this.pending.slots.push(sl); this.pending.kinds.push(kind) }
  }

  /** Bulk load, step 2: sorts the staged entries in with the others (by key, then kind). */
  commit(): void {
    const p = this.pending
    this.pending = null
    if (!p || !p.keys.length) return
    const keys = this.keys.concat(p.keys), slots = this.slots.concat(p.slots), kinds = this.kinds.concat(p.kinds)
    const order = Array.from({ length: keys.length }, (_, i) => i)
    order.sort((a, b) => (keys[a]! < keys[b]! ? -1 : keys[a]! > keys[b]! ? 1 : kinds[a]! - kinds[b]!))
    this.keys = order.map((i) => keys[i]!)
    this.slots = order.map((i) => slots[i]!)
    this.kinds = order.map((i) => kinds[i]!)
  }

  /** Puts entries straight into their sorted places (one part edited). */
  insert(entries: IdEntry[]): void {
    for (const [k, sl, kind] of entries) {
      const i = this.lowerBound(k)
      this.keys.splice(i, 0, k)
      this.slots.splice(i, 0, sl)
      this.kinds.splice(i, 0, kind)
    }
  }

  /** Drops every entry of one part slot. */
  removeSlot(slot: number): void {
    const keep: number[] = []
    for (let i = 0; i < this.slots.length; i++) if (this.slots[i] !== slot) keep.push(i)
    if (keep.length === this.slots.length) return
    this.keys = keep.map((i) => this.keys[i]!)
    this.kinds = keep.map((i) => this.kinds[i]!)
    this.slots = keep.map((i) => this.slots[i]!)
  }

  private lowerBound(key: string): number {
    let lo = 0, hi = this.keys.length
    while (lo < hi) { const mid = (lo + hi) >>> 1; if (this.keys[mid]! < key) lo = mid + 1; else hi = mid }
    return lo
  }

  /** Entries with exactly this key. */
  exact(key: string): number[] {
    const out: number[] = []
    for (let i = this.lowerBound(key); i < this.keys.length && this.keys[i] === key; i++) out.push(i)
    return out
  }

  /** Entries one slip away (Damerau: one substitution, deletion, insertion or swap of neighbours). */
  oneSlip(key: string): number[] {
    const variants = new Set<string>()
    for (let i = 0; i < key.length; i++) {
      variants.add(key.slice(0, i) + key.slice(i + 1))
      if (i + 1 < key.length) variants.add(key.slice(0, i) + key[i + 1] + key[i] + key.slice(i + 2))
      for (const c of ALPHABET) if (c !== key[i]) variants.add(key.slice(0, i) + c + key.slice(i + 1))
    }
    for (let i = 0; i <= key.length; i++) for (const c of ALPHABET) variants.add(key.slice(0, i) + c + key.slice(i))
    variants.delete(key)
    const out: number[] = []
    for (const v of variants) for (const i of this.exact(v)) out.push(i)
    return out
  }

  /** Entries whose key starts with `key` (not equal to it), at most `limit`. */
  prefixed(key: string, limit: number): number[] {
    const out: number[] = []
    for (let i = this.lowerBound(key); i < this.keys.length && this.keys[i]!.startsWith(key) && out.length < limit; i++) {
      if (this.keys[i] !== key) out.push(i)
    }
    return out
  }
}

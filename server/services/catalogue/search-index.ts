/**
 * Part search, step 2: the in-memory index and the executor of a {@link SearchPlan}. Pure (no I/O): the loader in
 * catalogue-index.ts fills it from the database and keeps it current.
 *
 * Built for a large catalogue (200k parts) on a small machine:
 * - identifiers (SKU, OE numbers, superseded SKUs) live in one sorted table (identifier-table.ts);
 * - per part only compact columns are kept (type, axle, status, attribute bits, the dimensions filters use, the
 *   word ids of its description: part-columns.ts); descriptions and specs are read from the database for the page
 *   shown;
 * - words: one `minisearch` index per part type holding only the words that are selective in that type (on at most
 *   {@link COMMON_DF} of its parts). Broader words keep plain posting lists and act as filters on the candidates
 *   instead of being scored, and type/axle words never get here (search-plan.ts makes them filters);
 * - a search touches only the part types it asks for; typo tolerance for words of five letters or more.
 */
import MiniSearch from 'minisearch'
import { DIMENSIONS, type Dimension, type DimensionRange } from '../../../shared/schemas/catalogue/list-query'
import { PART_TYPES, type PartType } from '../../../shared/schemas/catalogue/part-types'
import { axleOfSpecs } from '../../../shared/schemas/catalogue/specs'
import type { FittingRule } from '../../../shared/utils/catalogue/fitting-rules'
import type { AxleName } from '../../../shared/types/axles'
import { ID_KIND, IdentifierTable, norm, type IdEntry } from './identifier-table'
import type { Section, SectionSource, Sections } from './index-image'
import { ATTR_BITS, AXLE_CODE, TYPES_WITH_DIMENSION, attributesOf, dimensionsOf, fittingKey } from './part-columns'
import { editDistance, indexTerms, type ScoredTerm, type SearchPlan } from './search-plan'

export interface IndexInput {
  id: number
  sku: string
  type: PartType
  description: string
  productLine: string
  status: string
  specs: Record<string, unknown>
  /** OE numbers (any spelling; compared without spaces, dashes, dots) */
  oeNumbers: string[]
  /** old SKUs this part replaces, with the note */
  replaces: { oldSku: string; note: string }[]
}

export type MatchKind = 'sku' | 'superseded' | 'oe' | 'similar' | 'prefix' | 'text' | 'filter'
export interface Hit { id: number; score: number; by: MatchKind; oldSku?: string; note?: string; identifier?: string }

export interface SearchFilters {
  type?: PartType
  axle?: AxleName
  ranges?: Partial<Record<Dimension, DimensionRange>>
}

/**
 * A word on more than this many parts of a type is checked as a filter on candidates, not scored: scoring costs
 * about 20 µs a document in minisearch, so scored words must narrow the list to a few hundred parts per type.
 */
export const COMMON_DF = 300
/** Prefix lookups of identifiers stop after this many entries (a two-letter prefix matches a whole range). */
export const MAX_PREFIX_HITS = 500

const KIND_SCORE = [4e9, 3e9, 2e9, 1.5e9]
const KIND_NAME: MatchKind[] = ['sku', 'superseded', 'oe', 'sku']
const TYPE_CODE = new Map(PART_TYPES.map((t, i) => [t, i]))
const DIMS: readonly Dimension[] = DIMENSIONS
/** The text indexes' options (a saved one is loaded with the same). */
const MS_OPTIONS = {
  fields: ['text'], storeFields: [], tokenize: (s: string) => (s ? s.split(' ') : []), processTerm: (t: string) => t || null,
  searchOptions: { tokenize: (s: string) => [s], processTerm: (t: string) => t },
}

/**
 * The part slots of a broad word, in slot order: as loaded, a view of the saved section (no heap; ~5M slots at 1M
 * parts); an array once a part is added to it.
 */
type Posting = number[] | Int32Array

/** Adds a slot to a word's posting list (a loaded view becomes an array first). */
function postTo(common: Map<number, Posting>, word: number, slot: number): void {
  let list = common.get(word)
  if (!list) return
  if (!Array.isArray(list)) common.set(word, (list = Array.from(list)))
  list.push(slot)
}

interface TypeIndex {
  ms: MiniSearch<{ id: number; text: string }>
  /** part slots of this type, active first then by SKU (re-sorted lazily after changes) */
  list: number[]
  sorted: boolean
  /** whether `rankOf` holds each listed slot's place in `list` (dropped when the list is re-sorted) */
  ranked: boolean
  live: number
  df: Map<number, number>
  /** word ids kept out of `ms` because they were on too many parts when first seen, with their part slots */
  common: Map<number, Posting>
}

/**
 * Part id -> slot. Part ids are handed out in sequence, so a typed array indexed by id (4 bytes a part) holds them,
 * against ~40 bytes an entry in a Map of a million; an id far beyond the count of parts goes to a Map.
 */
class PartSlots {
  private byId = new Int32Array(0)
  private far = new Map<number, number>()
  size = 0

  get(id: number): number | undefined {
    const s = id >= 0 && id < this.byId.length ? this.byId[id]! : -1
    return s >= 0 ? s : this.far.get(id)
  }

  has(id: number): boolean { return this.get(id) !== undefined }

  set(id: number, slot: number): void {
    if (this.byId.length <= id && !this.far.has(id) && Number.isInteger(id) && id >= 0 && id < 2 * this.size + 1_000_000) {
      const b = new Int32Array(Math.max(id + 1, Math.ceil(this.byId.length * 1.5) + 1024)).fill(-1)
      b.set(this.byId)
      this.byId = b
    }
    if (id >= 0 && id < this.byId.length && !this.far.has(id)) {
      if (this.byId[id]! < 0) this.size++
      this.byId[id] = slot
    } else {
      if (!this.far.has(id)) this.size++
      this.far.set(id, slot)
    }
  }

  delete(id: number): void {
    if (id >= 0 && id < this.byId.length && this.byId[id]! >= 0) { this.byId[id] = -1; this.size-- } else if (this.far.delete(id)) this.size--
  }

  /** The highest id held (0 when none). */
  maxId(): number {
    let hi = 0
    for (let id = this.byId.length - 1; id > 0; id--) if (this.byId[id]! >= 0) { hi = id; break }
    for (const id of this.far.keys()) if (id > hi) hi = id
    return hi
  }
}

export class PartSearchIndex {
  // columns per slot
  // typed arrays with room to grow (`grow`); `slots` of them are used
  private slots = 0
  private partId: Int32Array = new Int32Array(0)
  private skuOf: string[] = []
  private typeOf: Uint8Array = new Uint8Array(0)
  private axleOf: Uint8Array = new Uint8Array(0)
  private statusOf: Uint8Array = new Uint8Array(0) // 0 active, 1 discontinued, 2 removed
  private attrsOf: Int32Array = new Int32Array(0)
  private dimsOf: Record<Dimension, Float64Array> = Object.fromEntries(DIMS.map((d) => [d, new Float64Array(0)])) as Record<Dimension, Float64Array>
  private dims2Of: Float64Array = new Float64Array(0) // second piston diameter
  /** each listed slot's place in its type's list (active first, then by SKU): matches are ordered by it, not by SKU text */
  private rankOf: Int32Array = new Int32Array(0)
  // the word ids of each slot: the first `flat` slots (those loaded from a saved file, or added in bulk) in one
  // buffer (`termBuf` from `termAt[slot]` to `termAt[slot + 1]`; a million arrays, or views of one, would cost
  // ~80-150 MB), later slots one array each in `termsOf` (at slot - flat); a removed slot (status 2) has none.
  // `termBuf` and `termAt` may have room beyond what is used
  private termBuf: Int32Array = new Int32Array(0)
  private termAt: Int32Array = new Int32Array(1)
  private flat = 0
  private termsOf: (Int32Array | null)[] = []
  private fitKeyOf: string[] = []
  /** one string per distinct fitting key (they repeat across parts) */
  private fitKeys = new Map<string, string>()
  private slotOf = new PartSlots()
  private ids = new IdentifierTable()
  private oldNotes = new Map<string, { oldSku: string; note: string }>()
  // words
  private vocab = new Map<string, number>()
  private vocabList: string[] = []
  private readonly types = new Map<PartType, TypeIndex>()
  private fittingRules: Record<PartType, FittingRule[]> | null = null

  constructor(fittingRules?: Record<PartType, FittingRule[]>) {
    this.fittingRules = fittingRules ?? null
    for (const t of PART_TYPES) this.types.set(t, { ms: new MiniSearch(MS_OPTIONS), list: [], sorted: true, ranked: false, live: 0, df: new Map(), common: new Map() })
  }

  /**
   * The whole index as named sections (index-image.ts writes them to a file): the per-part columns as typed
   * arrays, the identifiers, the words, and per part type its text index (minisearch's own JSON), list and counts.
   */
  toSections(): Sections {
    return new Map(this.sections())
  }

  /**
   * The sections of {@link toSections} one at a time, each made when the next is asked for, so a writer that
   * writes each before asking for the next never holds them all. With `consume` the index lets go of each piece
   * once its section is made, and is empty after (the index worker saves it so, its memory shrinking as the file
   * grows instead of holding the whole index and its copy). Columns are views of the index's own arrays, not
   * copies: take each before the index changes.
   */
  *sections(consume = false): Generator<[name: string, value: Section]> {
    if (!consume) this.fillTextLeft()
    // per part type first: a text index left for later (finish) is filled here, saved and let go before the next
    for (const [type, ti] of this.types) {
      if (this.textLater) this.fillText(type)
      const json = JSON.stringify(ti.ms)
      if (consume) ti.ms = new MiniSearch(MS_OPTIONS)
      yield [`${type}.ms`, json]
      yield [`${type}.list`, Int32Array.from(ti.list)]
      yield [`${type}.state`, Int32Array.of(ti.sorted ? 1 : 0, ti.live)]
      yield [`${type}.df`, Int32Array.from([...ti.df].flat())]
      const common = [...ti.common]
      if (consume) { ti.list = []; ti.df = new Map(); ti.common = new Map() }
      yield [`${type}.commonWords`, Int32Array.from(common.map(([w]) => w))]
      yield [`${type}.commonCounts`, Int32Array.from(common.map(([, slots]) => slots.length))]
      let size = 0
      for (const [, slots] of common) size += slots.length
      const commonSlots = new Int32Array(size)
      for (let i = 0, at = 0; i < common.length; i++) { commonSlots.set(common[i]![1], at); at += common[i]![1].length }
      common.length = 0
      yield [`${type}.commonSlots`, commonSlots]
    }
    this.textLater = false
    const n = this.slots
    // the word ids per part (they read the status column)
    const counts = new Int32Array(n)
    let total = 0
    for (let i = 0; i < n; i++) { const t = this.wordsOf(i); counts[i] = t ? t.length : -1; total += t ? t.length : 0 }
    yield ['termCounts', counts]
    const terms = new Int32Array(total)
    for (let i = 0, at = 0; i < n; i++) { const t = this.wordsOf(i); if (t) { terms.set(t, at); at += t.length } }
    if (consume) { this.termBuf = new Int32Array(0); this.termAt = new Int32Array(1); this.flat = 0; this.termsOf = [] }
    yield ['terms', terms]
    yield ['partId', this.partId.subarray(0, n)]
    yield ['sku', this.skuOf]
    if (consume) this.skuOf = []
    yield ['type', this.typeOf.subarray(0, n)]
    yield ['axle', this.axleOf.subarray(0, n)]
    yield ['status', this.statusOf.subarray(0, n)]
    yield ['attrs', this.attrsOf.subarray(0, n)]
    yield ['dims2', this.dims2Of.subarray(0, n)]
    yield ['fitKey', this.fitKeyOf]
    if (consume) { this.fitKeyOf = []; this.fitKeys = new Map() }
    yield ['vocab', this.vocabList]
    if (consume) { this.vocabList = []; this.vocab = new Map() }
    for (const d of DIMS) yield [`dim.${d}`, this.dimsOf[d].subarray(0, n)]
    if (consume) {
      const empty = new PartSearchIndex()
      this.slots = 0
      this.slotOf = empty.slotOf
      this.partId = empty.partId; this.typeOf = empty.typeOf; this.axleOf = empty.axleOf; this.statusOf = empty.statusOf
      this.attrsOf = empty.attrsOf; this.dimsOf = empty.dimsOf; this.dims2Of = empty.dims2Of; this.rankOf = empty.rankOf
    }
    const ids = this.ids.image()
    if (consume) this.ids = new IdentifierTable()
    yield ['id.bytes', ids.bytes]
    yield ['id.starts', ids.starts]
    yield ['id.slots', ids.slots]
    yield ['id.kinds', ids.kinds]
    const notes = [...this.oldNotes]
    if (consume) this.oldNotes = new Map()
    yield ['notes.keys', notes.map(([k]) => k)]
    yield ['notes.old', notes.map(([, v]) => v.oldSku)]
    yield ['notes.text', notes.map(([, v]) => v.note)]
  }

  /**
   * An index back from {@link toSections}: answers exactly as the one saved. Pauses between the columns and each
   * part type's text index, so a server loading a large one at start still answers other requests meanwhile.
   */
  static async fromSections(sec: SectionSource, fittingRules?: Record<PartType, FittingRule[]>): Promise<PartSearchIndex> {
    // each section is read (from the file: waiting on the disk, not the event loop) and turned into the index's
    // own shape before the next is read, with a pause after each step, so a server loading a million parts at
    // start keeps answering meanwhile and never holds more than one section's raw bytes beside the index
    const pause = () => new Promise<void>((res) => setImmediate(res))
    const get = async <T extends Section>(name: string): Promise<T> => {
      const v = await sec.get(name)
      if (v === undefined) throw new Error(`part search index file: no section ${name}`)
      await pause()
      return v as T
    }
    const ix = new PartSearchIndex(fittingRules)
    ix.partId = await get<Int32Array>('partId')
    ix.slots = ix.partId.length
    ix.skuOf = await get<string[]>('sku')
    ix.typeOf = await get<Uint8Array>('type')
    ix.axleOf = await get<Uint8Array>('axle')
    ix.statusOf = await get<Uint8Array>('status')
    ix.attrsOf = await get<Int32Array>('attrs')
    ix.dims2Of = await get<Float64Array>('dims2')
    ix.rankOf = new Int32Array(ix.dims2Of.length)
    for (const d of DIMS) ix.dimsOf[d] = await get<Float64Array>(`dim.${d}`)
    // fitting keys repeat across parts: one string each
    ix.fitKeyOf = (await get<string[]>('fitKey')).map((k) => ix.fitKeyString(k))
    await pause()
    ix.vocabList = await get<string[]>('vocab')
    ix.vocab = new Map(ix.vocabList.map((w, i) => [w, i]))
    const counts = await get<Int32Array>('termCounts'), terms = await get<Int32Array>('terms')
    ix.termBuf = terms
    ix.termAt = new Int32Array(counts.length + 1)
    ix.flat = counts.length
    for (let i = 0; i < counts.length; i++) ix.termAt[i + 1] = ix.termAt[i]! + Math.max(0, counts[i]!)
    await pause()
    for (let slot = 0; slot < ix.slots; slot++) if (ix.statusOf[slot] !== 2) ix.slotOf.set(ix.partId[slot]!, slot)
    await pause()
    ix.ids = IdentifierTable.fromImage({ bytes: await get('id.bytes'), starts: await get('id.starts'), slots: await get('id.slots'), kinds: await get('id.kinds') })
    const nk = await get<string[]>('notes.keys'), no = await get<string[]>('notes.old'), nt = await get<string[]>('notes.text')
    nk.forEach((k, i) => ix.oldNotes.set(k, { oldSku: no[i]!, note: nt[i]! }))
    for (const [type, ti] of ix.types) {
      ti.ms = MiniSearch.loadJSON(await get<string>(`${type}.ms`), MS_OPTIONS)
      await pause()
      ti.list = Array.from(await get<Int32Array>(`${type}.list`))
      const state = await get<Int32Array>(`${type}.state`)
      ti.sorted = state[0] === 1
      ti.live = state[1]!
      const df = await get<Int32Array>(`${type}.df`)
      for (let i = 0; i < df.length; i += 2) ti.df.set(df[i]!, df[i + 1]!)
      const cw = await get<Int32Array>(`${type}.commonWords`), cc = await get<Int32Array>(`${type}.commonCounts`), cs = await get<Int32Array>(`${type}.commonSlots`)
      for (let i = 0, at = 0; i < cw.length; i++) { ti.common.set(cw[i]!, cs.subarray(at, at + cc[i]!)); at += cc[i]! }
    }
    return ix
  }

  get size(): number { return this.slotOf.size }

  has(partId: number): boolean { return this.slotOf.has(partId) }

  /** The highest part id indexed (0 when empty). */
  maxPartId(): number {
    return this.slotOf.maxId()
  }

  /** SKU, type, axle and status of an indexed part. */
  info(partId: number): { sku: string; type: PartType; axle: AxleName | null; status: string } | null {
    const s = this.slotOf.get(partId)
    if (s === undefined) return null
    return { sku: this.skuOf[s]!, type: PART_TYPES[this.typeOf[s]!]!, axle: this.axleOf[s] === 1 ? 'front' : this.axleOf[s] === 2 ? 'rear' : null, status: this.statusOf[s] === 0 ? 'active' : 'discontinued' }
  }

  /** The word ids of a slot's description and product line (null once removed). */
  private wordsOf(slot: number): Int32Array | null {
    if (this.statusOf[slot] === 2) return null
    const flat = this.flat
    return slot < flat ? this.termBuf.subarray(this.termAt[slot]!, this.termAt[slot + 1]!) : this.termsOf[slot - flat]!
  }

  private wordId(term: string): number {
    let id = this.vocab.get(term)
    if (id === undefined) { id = this.vocabList.length; this.vocab.set(term, id); this.vocabList.push(term) }
    return id
  }

  private grow(n: number): void {
    const cap = this.dims2Of.length
    if (n <= cap) return
    const next = Math.max(n, Math.ceil(cap * 1.5) + 1024)
    const g = (a: Float64Array) => { const b = new Float64Array(next).fill(Number.NaN); b.set(a); return b }
    for (const d of DIMS) this.dimsOf[d] = g(this.dimsOf[d])
    this.dims2Of = g(this.dims2Of)
    const gi = <T extends Int32Array | Uint8Array>(a: T, b: T): T => { b.set(a); return b }
    this.rankOf = gi(this.rankOf, new Int32Array(next))
    this.partId = gi(this.partId, new Int32Array(next))
    this.attrsOf = gi(this.attrsOf, new Int32Array(next))
    this.typeOf = gi(this.typeOf, new Uint8Array(next))
    this.axleOf = gi(this.axleOf, new Uint8Array(next))
    this.statusOf = gi(this.statusOf, new Uint8Array(next))
  }

  /** The one string kept for this fitting key. */
  private fitKeyString(key: string): string {
    const s = this.fitKeys.get(key)
    if (s !== undefined) return s
    this.fitKeys.set(key, key)
    return key
  }

  /** Appends a slot's words to the one buffer (bulk adds while every slot so far is in it). */
  private putFlat(words: number[]): void {
    const end = this.termAt[this.flat]!
    if (this.termAt.length < this.flat + 2) { const b = new Int32Array(Math.ceil(this.termAt.length * 1.5) + 1024); b.set(this.termAt); this.termAt = b }
    if (this.termBuf.length < end + words.length) { const b = new Int32Array(Math.ceil(this.termBuf.length * 1.5) + words.length + 4096); b.set(this.termBuf.subarray(0, end)); this.termBuf = b }
    this.termBuf.set(words, end)
    this.termAt[++this.flat] = end + words.length
  }

  /** Fills columns for a new slot; returns the slot and its words. `bulk`: words into the one buffer when it can. */
  private place(input: IndexInput, bulk = false): { slot: number; words: number[] } {
    const slot = this.slots++
    this.grow(slot + 1)
    const type = input.type
    this.partId[slot] = input.id
    this.skuOf.push(input.sku)
    this.typeOf[slot] = TYPE_CODE.get(type)!
    const axle = axleOfSpecs(type, input.specs)
    this.axleOf[slot] = axle ? AXLE_CODE[axle] : 0
    this.statusOf[slot] = input.status === 'active' ? 0 : 1
    this.attrsOf[slot] = attributesOf(input.specs)
    const dims = dimensionsOf(type, input.specs)
    for (const d of DIMS) {
      const v = dims[d]
      if (v?.length) {
        this.dimsOf[d][slot] = v[0]!
        if (d === 'piston' && v.length > 1) this.dims2Of[slot] = v[1]!
      }
    }
    const words = [...new Set(indexTerms(`${input.description} ${input.productLine}`))].map((w) => this.wordId(w))
    if (bulk && slot === this.flat && !this.termsOf.length) this.putFlat(words)
    else this.termsOf.push(Int32Array.from(words))
    this.fitKeyOf.push(this.fittingRules ? this.fitKeyString(fittingKey(type, input.specs, this.fittingRules[type])) : '')
    this.slotOf.set(input.id, slot)
    const ti = this.types.get(type)!
    ti.list.push(slot)
    ti.sorted = false
    ti.live++
    for (const w of words) ti.df.set(w, (ti.df.get(w) ?? 0) + 1)
    return { slot, words }
  }

  private identifierEntries(input: IndexInput, slot: number): IdEntry[] {
    const sku = norm(input.sku)
    const out: IdEntry[] = [[sku, slot, ID_KIND.sku]]
    const digitsOnly = sku.replace(/^[a-z]+/, '')
    if (digitsOnly !== sku && digitsOnly.length >= 3) out.push([digitsOnly, slot, ID_KIND.skuDigits])
    for (const o of input.oeNumbers) out.push([norm(o), slot, ID_KIND.oe])
    for (const r of input.replaces) {
      out.push([norm(r.oldSku), slot, ID_KIND.superseded])
      this.oldNotes.set(`${norm(r.oldSku)}|${slot}`, r)
    }
    return out.filter((e) => e[0].length > 0)
  }

  private msText(type: PartType, words: ArrayLike<number>): string {
    const ti = this.types.get(type)!
    let text = ''
    for (let i = 0; i < words.length; i++) if (!ti.common.has(words[i]!)) text += (text ? ' ' : '') + this.vocabList[words[i]!]!
    return text
  }

  /** Bulk load, step 1 (any number of batches): columns, words and identifiers of each part. */
  addBatch(inputs: Iterable<IndexInput>): void {
    for (const input of inputs) {
      if (this.slotOf.has(input.id)) continue
      const { slot } = this.place(input, true)
      this.ids.stage(this.identifierEntries(input, slot))
    }
  }

  /**
   * Bulk load, step 2: decides which words are common per type, fills the text indexes and sorts the identifiers.
   * With `textLater` the text indexes are filled when first needed instead: a save with `consume`
   * ({@link sections}) fills, writes and drops them one part type at a time, so they never all sit in memory at
   * once (at a million parts, ~250 MB for all of them); a search or change fills them all first.
   */
  finish(textLater = false): void {
    for (const ti of this.types.values()) for (const [w, n] of ti.df) if (n > COMMON_DF && !ti.common.has(w)) ti.common.set(w, [])
    for (let slot = 0; slot < this.slots; slot++) {
      const terms = this.wordsOf(slot)
      if (!terms) continue
      const ti = this.types.get(PART_TYPES[this.typeOf[slot]!]!)!
      for (const w of terms) postTo(ti.common, w, slot)
    }
    this.textLater = true
    if (!textLater) this.fillTextLeft()
    this.ids.commit()
    for (const t of this.types.keys()) this.listOf(t)
  }

  /** whether text indexes are left to fill ({@link finish}) */
  private textLater = false

  /** Fills a part type's text index with its parts not yet in it (one type's documents at a time: all at once cost ~60 MB more at a million parts). */
  private fillText(type: PartType): void {
    const ti = this.types.get(type)!
    const code = TYPE_CODE.get(type)!
    const docs: { id: number; text: string }[] = []
    for (let slot = 0; slot < this.slots; slot++) {
      if (this.typeOf[slot] !== code) continue
      const terms = this.wordsOf(slot)
      if (terms && !ti.ms.has(slot)) docs.push({ id: slot, text: this.msText(type, terms) })
    }
    if (docs.length) ti.ms.addAll(docs)
  }

  /** Fills every text index left for later. */
  private fillTextLeft(): void {
    if (!this.textLater) return
    for (const type of this.types.keys()) this.fillText(type)
    this.textLater = false
  }

  /** Adds many parts at once. */
  addAll(inputs: Iterable<IndexInput>): void {
    this.addBatch(inputs)
    this.finish()
  }

  /** Adds or replaces one part (after an edit). */
  upsert(input: IndexInput): void {
    this.apply([input], [])
  }

  remove(partId: number): void {
    this.apply([], [partId])
  }

  /**
   * Replaces these parts (`inputs`) and drops those (`removed`): re-reading a few thousand changed parts costs one
   * pass over the identifiers and each type's list, not one per part.
   */
  apply(inputs: IndexInput[], removed: number[]): void {
    this.fillTextLeft()
    const gone = new Set<number>()
    const touched = new Set<PartType>()
    for (const partId of [...removed, ...inputs.map((i) => i.id)]) {
      const slot = this.slotOf.get(partId)
      if (slot === undefined) continue
      const type = PART_TYPES[this.typeOf[slot]!]!
      const ti = this.types.get(type)!
      ti.ms.discard(slot)
      ti.live--
      for (const w of this.wordsOf(slot) ?? []) {
        const n = (ti.df.get(w) ?? 1) - 1
        if (n <= 0) ti.df.delete(w)
        else ti.df.set(w, n)
      }
      this.statusOf[slot] = 2
      if (slot >= this.flat) this.termsOf[slot - this.flat] = null
      this.slotOf.delete(partId)
      gone.add(slot)
      touched.add(type)
    }
    for (const type of touched) { const ti = this.types.get(type)!; ti.list = ti.list.filter((s) => !gone.has(s)) }
    const entries: IdEntry[] = []
    for (const input of inputs) {
      const { slot, words } = this.place(input)
      const ti = this.types.get(input.type)!
      for (const w of words) postTo(ti.common, w, slot)
      ti.ms.add({ id: slot, text: this.msText(input.type, words) })
      for (const e of this.identifierEntries(input, slot)) entries.push(e)
    }
    this.ids.replace(gone, entries)
  }

  private listOf(type: PartType): number[] {
    const ti = this.types.get(type)!
    if (!ti.sorted) {
      ti.list.sort((a, b) => this.statusOf[a]! - this.statusOf[b]! || (this.skuOf[a]! < this.skuOf[b]! ? -1 : this.skuOf[a]! > this.skuOf[b]! ? 1 : 0))
      ti.sorted = true
      ti.ranked = false
    }
    if (!ti.ranked) {
      const list = ti.list, rank = this.rankOf
      for (let i = 0; i < list.length; i++) rank[list[i]!] = i
      ti.ranked = true
    }
    return ti.list
  }

  /** Active parts of a type with the same exact-equality fitting key (candidates for alternatives). */
  sameFittingKey(partId: number, limit = 2000): number[] {
    const slot = this.slotOf.get(partId)
    if (slot === undefined) return []
    const type = PART_TYPES[this.typeOf[slot]!]!
    const key = this.fitKeyOf[slot]
    const out: number[] = []
    for (const s of this.listOf(type)) {
      if (s !== slot && this.statusOf[s] === 0 && this.fitKeyOf[s] === key) { out.push(this.partId[s]!); if (out.length >= limit) break }
    }
    return out
  }

  // ---- words

  /** Word ids a query word stands for: exact, by prefix, or within its edit distance. */
  private resolveWord(t: ScoredTerm): number[] {
    const out: number[] = []
    const exactId = this.vocab.get(t.term)
    if (exactId !== undefined) out.push(exactId)
    for (let id = 0; id < this.vocabList.length; id++) {
      if (id === exactId) continue
      const w = this.vocabList[id]!
      if (t.prefix && t.term.length >= 2 && w.startsWith(t.term)) { out.push(id); continue }
      if (t.fuzzy > 0 && Math.abs(w.length - t.term.length) <= t.fuzzy && editDistance(t.term, w, t.fuzzy) <= t.fuzzy) out.push(id)
    }
    return out
  }

  /** Runs a plan with the route's filters; hits in rank order. */
  search(plan: SearchPlan, filters: SearchFilters = {}): { hits: Hit[]; types: PartType[] } {
    this.fillTextLeft()
    let types = new Set<PartType>(PART_TYPES)
    const keep = (ts: readonly PartType[]) => { types = new Set([...types].filter((t) => ts.includes(t))) }
    if (plan.types) keep(plan.types)
    if (filters.type) keep([filters.type])
    const ranges = Object.entries(filters.ranges ?? {}) as [Dimension, DimensionRange][]
    for (const [d] of ranges) keep(TYPES_WITH_DIMENSION[d])
    for (const n of plan.numbers) if (n.dims) keep(n.dims.flatMap((d) => TYPES_WITH_DIMENSION[d]))
    if (filters.axle && plan.axle && filters.axle !== plan.axle) return { hits: [], types: [...types] }
    const axle = filters.axle ?? plan.axle
    const axleCode = axle ? AXLE_CODE[axle] : 0
    let attrMask = 0
    for (const a of plan.attributes) attrMask |= ATTR_BITS[a]
    // the filters as flat data, checked per candidate without building anything (a type + size query checks
    // every part of its type: 200k discs at a million parts)
    const typeOk = new Uint8Array(PART_TYPES.length)
    for (const t of types) typeOk[TYPE_CODE.get(t)!] = 1
    // each test passes when any of its columns holds a value within [lo, hi] (a second piston diameter counts;
    // no value is NaN, which fails both comparisons)
    const columnsOf = (dims: readonly Dimension[]) => dims.flatMap((d) => (d === 'piston' ? [this.dimsOf[d], this.dims2Of] : [this.dimsOf[d]]))
    const tests = [
      ...ranges.map(([d, r]) => ({ cols: columnsOf([d]), lo: (r.min ?? -Infinity) - 1e-9, hi: (r.max ?? Infinity) + 1e-9 })),
      ...plan.numbers.map((n) => ({ cols: columnsOf(n.dims ?? DIMS), lo: n.value - n.tolerance - 1e-9, hi: n.value + n.tolerance + 1e-9 })),
    ]
    const statusOf = this.statusOf, typeOf = this.typeOf, axleOf = this.axleOf, attrsOf = this.attrsOf
    const accept = (slot: number): boolean => {
      if (statusOf[slot] === 2 || typeOk[typeOf[slot]!] === 0) return false
      if (axleCode && axleOf[slot] !== axleCode) return false
      if (attrMask && (attrsOf[slot]! & attrMask) !== attrMask) return false
      for (let k = 0; k < tests.length; k++) {
        const { cols, lo, hi } = tests[k]!
        let ok = false
        for (let c = 0; c < cols.length && !ok; c++) { const v = cols[c]![slot]!; ok = v >= lo && v <= hi }
        if (!ok) return false
      }
      return true
    }

    const words = plan.terms.filter((t) => t.kind === 'word').map((t) => ({ t, ids: this.resolveWord(t) }))
    // per query word, a flag per word id (the vocabulary is small: a few hundred to a few thousand words)
    const wordMasks = words.map((w) => { const m = new Uint8Array(this.vocabList.length); for (const id of w.ids) m[id] = 1; return m })
    const termsOf = this.termsOf, termBuf = this.termBuf, termAt = this.termAt, loaded = this.flat
    const hasWords = (slot: number, mode: 'AND' | 'OR') => {
      if (!wordMasks.length) return true
      if (statusOf[slot] === 2) return false
      // the slot's words as [from, to) of one array, without a view per call
      const terms = slot < loaded ? termBuf : termsOf[slot - loaded]!
      const from = slot < loaded ? termAt[slot]! : 0, to = slot < loaded ? termAt[slot + 1]! : terms.length
      for (let k = 0; k < wordMasks.length; k++) {
        const mask = wordMasks[k]!
        let found = false
        for (let i = from; i < to; i++) if (mask[terms[i]!] === 1) { found = true; break }
        if (mode === 'AND' && !found) return false
        if (mode === 'OR' && found) return true
      }
      return mode === 'AND'
    }

    // identifiers: exact first (SKU, then parts replacing a superseded SKU, then OE), then one-slip, then prefix
    const hits: Hit[] = []
    const seen = new Set<number>()
    const ids = this.ids
    const push = (entry: number, score: number, by?: MatchKind) => {
      const slot = ids.slot(entry)
      if (seen.has(slot) || !accept(slot) || !hasWords(slot, 'AND')) return
      seen.add(slot)
      const kind = ids.kind(entry)
      const h: Hit = { id: this.partId[slot]!, score, by: by ?? KIND_NAME[kind]!, identifier: ids.key(entry) }
      if (kind === ID_KIND.superseded) {
        // a superseded SKU, typed exactly or with a slip, lists its replacement and says so
        const n = this.oldNotes.get(`${ids.key(entry)}|${slot}`)
        if (n) { h.oldSku = n.oldSku; h.note = n.note }
        if (by !== 'prefix') h.by = 'superseded'
      }
      hits.push(h)
    }
    const identifiers = plan.terms.filter((t) => t.kind === 'identifier')
    for (const t of identifiers) {
      const exact = ids.exact(t.term).sort((a, b) => KIND_SCORE[ids.kind(b)]! - KIND_SCORE[ids.kind(a)]!)
      // a discontinued SKU ranks after the part that replaced it (its superseded entry scores higher)
      for (const e of exact) push(e, ids.kind(e) === ID_KIND.sku && this.statusOf[ids.slot(e)] !== 0 ? 2.5e9 : KIND_SCORE[ids.kind(e)]!)
      // one slip away, even when the typed number exists: with numbers handed out in sequence a slipped SKU is
      // usually another real part, listed first, and the one meant must still be on the page after it
      if (t.fuzzy > 0) for (const { entry, cost } of ids.oneSlipRanked(t.term)) push(entry, 1e9 - cost * 1e6 - ids.kind(entry), 'similar')
      if (t.prefix) for (const e of ids.prefixed(t.term, MAX_PREFIX_HITS)) push(e, 5e8 - ids.key(e).length, 'prefix')
    }
    hits.sort((a, b) => b.score - a.score)
    if (identifiers.length) return { hits, types: [...types] }

    const rest = this.wordsOrScan(words, types, accept, hasWords, 'AND')
    if (rest.length === 0 && words.length > 1) return { hits: this.wordsOrScan(words, types, accept, hasWords, 'OR'), types: [...types] }
    return { hits: rest, types: [...types] }
  }

  private wordsOrScan(
    words: { t: ScoredTerm; ids: number[] }[], types: Set<PartType>, accept: (slot: number) => boolean,
    hasWords: (slot: number, mode: 'AND' | 'OR') => boolean, mode: 'AND' | 'OR',
  ): Hit[] {
    const out: Hit[] = []
    let scored = false
    for (const type of PART_TYPES) {
      if (!types.has(type)) continue
      const ti = this.types.get(type)!
      // per type: a word is selective when every word id it stands for is kept in this type's text index
      const present = words.map((w) => ({ ...w, ids: w.ids.filter((id) => ti.df.has(id)) }))
      if (mode === 'AND' && present.some((w) => w.ids.length === 0)) continue
      const selective = present.filter((w) => w.ids.length > 0 && w.ids.every((id) => !ti.common.has(id)))
      if (selective.length && mode === 'AND') {
        scored = true
        const exactOf = (w: { t: ScoredTerm; ids: number[] }) => (this.vocab.get(w.t.term) !== undefined && w.ids.includes(this.vocab.get(w.t.term)!) ? [w.t.term] : [])
        const results = ti.ms.search({
          combineWith: 'AND',
          // each word: any of the words it stands for; the exact spelling counts twice so it ranks above a typo
          queries: selective.map((w) => ({ combineWith: 'OR', queries: [...w.ids.map((id) => this.vocabList[id]!), ...exactOf(w)] })),
        }, { filter: (r) => accept(r.id as number) && hasWords(r.id as number, 'AND') })
        for (const r of results) out.push({ id: this.partId[r.id as number]!, score: r.score, by: 'text' })
        continue
      }
      if (!words.length || mode === 'OR') {
        for (const slot of this.listOf(type)) if (accept(slot) && hasWords(slot, mode)) out.push({ id: this.partId[slot]!, score: 0, by: words.length ? 'text' : 'filter' })
        continue
      }
      // every word is broad here: walk the shortest posting list (of the word that narrows most) and check the rest
      let best: Posting | null = null
      for (const w of present) {
        const lists = w.ids.map((id) => ti.common.get(id)).filter((l): l is Posting => !!l)
        const size = lists.reduce((n, l) => n + l.length, 0)
        if (lists.length === w.ids.length && (best === null || size < best.length)) best = lists.length === 1 ? lists[0]! : lists.flatMap((l) => Array.from(l))
      }
      const list = this.listOf(type) // sorted and ranked: matches are put in its order
      const matched: number[] = []
      // a single posting list holds each slot once; several (a word standing for several) may repeat one
      const seen = best && best !== list && words.some((w) => w.ids.length > 1) ? new Set<number>() : null
      for (const slot of best ?? list) {
        if (seen) { if (seen.has(slot)) continue; seen.add(slot) }
        if (accept(slot) && hasWords(slot, 'AND')) matched.push(slot)
      }
      const rank = this.rankOf
      matched.sort((a, b) => rank[a]! - rank[b]!)
      for (const slot of matched) out.push({ id: this.partId[slot]!, score: 0, by: 'text' })
    }
    if (scored) out.sort((a, b) => b.score - a.score)
    return out
  }
}

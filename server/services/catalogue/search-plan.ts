/**
 * Part search, step 1: turn what the user typed into a plan, before any index is touched. The plan is what makes
 * the search fast on a large catalogue: words that name a part type or an axle become filters (they would match
 * tens of thousands of parts if scored), numbers become dimension ranges, a few attribute words ("vented",
 * "reman", "electric") become spec filters, stop words are dropped, and only identifiers and the remaining words
 * are scored, with fuzzy matching for identifiers and longer words only. Pure: no I/O.
 */
import { normaliseIdentifier } from '../../../shared/schemas/catalogue/params'
import type { Dimension } from '../../../shared/schemas/catalogue/list-query'
import type { PartType } from '../../../shared/schemas/catalogue/part-types'
import type { AxleName } from '../../../shared/types/axles'

export type Attribute = 'vented' | 'solid' | 'remanufactured' | 'new' | 'electric' | 'cable' | 'tandem'

export interface DimensionValue {
  value: number
  tolerance: number
  /** dimensions the number applies to; null = any dimension of the part */
  dims: Dimension[] | null
  raw: string
}

export interface ScoredTerm {
  term: string
  kind: 'identifier' | 'word'
  prefix: boolean
  /** maximum edit distance (0 = exact/prefix only) */
  fuzzy: number
}

export interface SearchPlan {
  types: PartType[] | null
  axle: AxleName | null
  attributes: Attribute[]
  numbers: DimensionValue[]
  /** normalised identifiers to look up exactly (SKU, OE number, superseded SKU) */
  identifiers: string[]
  terms: ScoredTerm[]
  /** words left out (stop words), for the response's explanation */
  ignored: string[]
}

const TYPE_WORDS: Record<string, PartType[]> = {
  pad: ['pad_set'], pads: ['pad_set'], padset: ['pad_set'], padsets: ['pad_set'],
  disc: ['disc'], discs: ['disc'], disk: ['disc'], disks: ['disc'], rotor: ['disc'], rotors: ['disc'],
  caliper: ['caliper'], calipers: ['caliper'], calliper: ['caliper'], callipers: ['caliper'],
  drum: ['drum'], drums: ['drum'],
  shoe: ['shoe_set'], shoes: ['shoe_set'], shoeset: ['shoe_set'],
  hose: ['hose'], hoses: ['hose'],
  fluid: ['fluid'], fluids: ['fluid'],
  sensor: ['wear_sensor'], sensors: ['wear_sensor'],
  kit: ['fitting_kit'], kits: ['fitting_kit'],
  mc: ['master_cylinder'], master: ['master_cylinder'], mastercylinder: ['master_cylinder'],
  wc: ['wheel_cylinder'],
  cylinder: ['master_cylinder', 'wheel_cylinder'], cylinders: ['master_cylinder', 'wheel_cylinder'],
}
/** Two-word names, read before single words. */
const TYPE_PHRASES: [string, PartType[]][] = [
  ['master cylinder', ['master_cylinder']], ['wheel cylinder', ['wheel_cylinder']], ['pad set', ['pad_set']],
  ['shoe set', ['shoe_set']], ['wear sensor', ['wear_sensor']], ['fitting kit', ['fitting_kit']],
  ['brake fluid', ['fluid']], ['brake hose', ['hose']],
]
const AXLE_WORDS: Record<string, AxleName> = { front: 'front', rear: 'rear', back: 'rear' }
const ATTRIBUTE_WORDS: Record<string, Attribute> = {
  vented: 'vented', ventilated: 'vented', solid: 'solid',
  reman: 'remanufactured', remanufactured: 'remanufactured', exchange: 'remanufactured', recon: 'remanufactured',
  new: 'new', electric: 'electric', epb: 'electric', cable: 'cable', tandem: 'tandem',
}
const DIMENSION_WORDS: Record<string, Dimension> = {
  bore: 'bore', diameter: 'diameter', dia: 'diameter', piston: 'piston', pistons: 'piston',
  thickness: 'thickness', thick: 'thickness', width: 'width', wide: 'width', length: 'length', long: 'length',
}
/** Words that carry no meaning in a brake-parts search. */
export const STOP_WORDS = new Set(['the', 'a', 'an', 'for', 'and', 'with', 'of', 'to', 'in', 'on', 'set', 'brake', 'brakes',
  'mm', 'x', '×', 'pair', 'part', 'parts', 'axle', 'side', 'fits', 'fit', 'type', 'or', 'by'])

/** Optimal string alignment distance (Damerau-Levenshtein with adjacent transpositions), stopping above `max`. */
export function editDistance(a: string, b: string, max = 3): number {
  if (Math.abs(a.length - b.length) > max) return max + 1
  const rows: number[][] = []
  for (let i = 0; i <= a.length; i++) rows.push([i])
  for (let j = 1; j <= b.length; j++) rows[0]![j] = j
  for (let i = 1; i <= a.length; i++) {
    let best = Infinity
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1
      let v = Math.min(rows[i - 1]![j]! + 1, rows[i]![j - 1]! + 1, rows[i - 1]![j - 1]! + cost)
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, rows[i - 2]![j - 2]! + 1)
      rows[i]![j] = v
      if (v < best) best = v
    }
    if (best > max) return max + 1
  }
  return rows[a.length]![b.length]!
}

/** Edit distance allowed for a word of this length: none under 5 letters, 1 up to 7, 2 from 8 (common practice). */
export function fuzzyFor(term: string, kind: 'identifier' | 'word'): number {
  if (kind === 'identifier') return term.length >= 9 ? 2 : term.length >= 5 ? 1 : 0
  return term.length >= 8 ? 2 : term.length >= 5 ? 1 : 0
}

/** A vocabulary word within the allowed distance (type names typed with a slip: "calipre", "cylindre"). */
function nearest<T>(word: string, table: Record<string, T>): T | undefined {
  const max = fuzzyFor(word, 'word')
  if (max === 0) return undefined
  let best: T | undefined, bestD = max + 1
  for (const [w, v] of Object.entries(table)) {
    if (w.length < 5) continue
    const d = editDistance(word, w, max)
    if (d < bestD) { bestD = d; best = v }
  }
  return best
}

const NUMBER = /^(\d{1,3})(?:[.,](\d{1,3}))?(mm)?$/
const FRACTION = /^(\d{1,2})\/(\d{1,2})(in|")?$/
const INCHES = /^(\d{1,2}(?:\.\d{1,3})?)(in|")$/

function dimensionNumber(token: string): { value: number; tolerance: number } | null {
  let m = NUMBER.exec(token)
  if (m) {
    const decimals = m[2] ? m[2].length : 0
    // a whole number matches within half a millimetre; "22.22" within 0.02 mm (so it matches 7/8 in = 22.225 mm)
    return { value: Number(`${m[1]}.${m[2] ?? '0'}`), tolerance: decimals ? 0.02 : 0.5 }
  }
  m = FRACTION.exec(token)
  if (m && Number(m[2]) > 0 && Number(m[1]) < Number(m[2]) * 2) return { value: (Number(m[1]) / Number(m[2])) * 25.4, tolerance: 0.05 } // 1 in = 25.4 mm (NIST SP 811)
  m = INCHES.exec(token)
  if (m) return { value: Number(m[1]) * 25.4, tolerance: 0.05 }
  return null
}

const isIdentifierLike = (t: string) => (/\d/.test(t) && /[a-z]/.test(t)) || /^\d{4,}$/.test(t.replace(/[-./]/g, ''))

/** Splits, classifies and normalises a query. `q` is at most a couple of hundred characters (schema-checked). */
export function planQuery(q: string): SearchPlan {
  const plan: SearchPlan = { types: null, axle: null, attributes: [], numbers: [], identifiers: [], terms: [], ignored: [] }
  let text = q.toLowerCase().normalize('NFKC').replace(/[,;()]+/g, ' ')
  // "300x25", "300 × 25 × 12": an x between whole numbers separates sizes; an x inside an identifier
  // ("ZQ 66MU9X 01", an OE number) is a letter of it
  for (let pass = 0; pass < 4; pass++) {
    const split = text.replace(/(?<=(?:^|\s)\d+(?:\.\d+)?)\s*[x×]\s*(?=\d)/g, ' ')
    if (split === text) break
    text = split
  }
  text = text.trim()
  if (!text) return plan
  const addTypes = (ts: PartType[]) => { plan.types = [...new Set([...(plan.types ?? []), ...ts])] }

  for (const [phrase, ts] of TYPE_PHRASES) {
    if (text.includes(phrase)) { addTypes(ts); text = text.split(phrase).join(' ') }
  }
  const tokens = text.split(/\s+/).filter(Boolean)

  // An identifier typed with spaces ("VLT 615 301 C", "QLN 1234-567"): short letter groups and digit groups only.
  if (tokens.length >= 2 && tokens.every((t) => /^[a-z0-9./-]+$/.test(t) && !(t in TYPE_WORDS) && !(t in AXLE_WORDS) && !(t in ATTRIBUTE_WORDS) && !(t in DIMENSION_WORDS))) {
    const letterOnly = tokens.filter((t) => /^[a-z]+$/.test(t))
    const joined = normaliseIdentifier(tokens.join('')).toLowerCase()
    const allSmallNumbers = tokens.every((t) => dimensionNumber(t) !== null)
    if (!allSmallNumbers && letterOnly.every((t) => t.length <= 4 && !STOP_WORDS.has(t)) && (joined.match(/\d/g)?.length ?? 0) >= 3) {
      plan.identifiers.push(joined)
      plan.terms.push({ term: joined, kind: 'identifier', prefix: true, fuzzy: fuzzyFor(joined, 'identifier') })
      return plan
    }
  }

  let dimsHint: Dimension[] | null = null
  const numberTokens: { token: string; value: number; tolerance: number }[] = []
  for (const [i, raw] of tokens.entries()) {
    const token = raw.replace(/^[-./]+|[-./]+$/g, '')
    if (!token) continue
    const isLast = i === tokens.length - 1
    if (token in TYPE_WORDS) { addTypes(TYPE_WORDS[token]!); continue }
    if (token in AXLE_WORDS) { plan.axle = AXLE_WORDS[token]!; continue }
    if (token in ATTRIBUTE_WORDS) { plan.attributes.push(ATTRIBUTE_WORDS[token]!); continue }
    if (token in DIMENSION_WORDS) { dimsHint = [...new Set([...(dimsHint ?? []), DIMENSION_WORDS[token]!])]; continue }
    if (STOP_WORDS.has(token)) { plan.ignored.push(token); continue }
    const n = dimensionNumber(token)
    if (n) { numberTokens.push({ token, ...n }); continue }
    if (isIdentifierLike(token)) {
      const id = normaliseIdentifier(token).toLowerCase()
      plan.identifiers.push(id)
      plan.terms.push({ term: id, kind: 'identifier', prefix: true, fuzzy: fuzzyFor(id, 'identifier') })
      continue
    }
    const word = token.replace(/[^a-z0-9]/g, '')
    if (word.length < 2) { plan.ignored.push(token); continue }
    // a slip in a type or axle word still filters ("calipre", "frnot" is too short to guess)
    const t = nearest(word, TYPE_WORDS)
    if (t) { addTypes(t); continue }
    const a = nearest(word, AXLE_WORDS)
    if (a) { plan.axle = a; continue }
    plan.terms.push({ term: word, kind: 'word', prefix: isLast || word.length >= 4, fuzzy: fuzzyFor(word, 'word') })
  }
  plan.numbers = numberTokens.map((n) => ({ value: n.value, tolerance: n.tolerance, dims: dimsHint, raw: n.token }))
  return plan
}

let excluded: Set<string> | null = null

/** Splits stored text into index terms with the same rules as queries (type/axle/stop words and numbers left out). */
export function indexTerms(text: string): string[] {
  excluded ??= new Set([...STOP_WORDS, ...Object.keys(TYPE_WORDS), ...Object.keys(AXLE_WORDS), ...Object.keys(ATTRIBUTE_WORDS), ...Object.keys(DIMENSION_WORDS)])
  const out: string[] = []
  for (const raw of text.toLowerCase().split(/[^a-z0-9]+/)) {
    if (raw.length < 2 || excluded.has(raw)) continue
    const c = raw.charCodeAt(0)
    if (c >= 48 && c <= 57 && /^\d+$/.test(raw)) continue
    out.push(raw)
  }
  return out
}

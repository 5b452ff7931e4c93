/**
 * Registration marks. Every format is stored normalised (capitals, no spaces) and shown as people write it. For the
 * configured national format the mark tells when the vehicle was first registered, which narrows its year when the
 * vehicle-data service has nothing.
 *
 * UK (Great Britain) rule, from DVLA leaflet INF104 "Vehicle registration numbers and number plates":
 * - current format since 1 September 2001: two letters (memory tag), two digits (age identifier), three letters.
 *   The age identifier is the year's last two digits for marks issued 1 March - 31 August, and that number + 50 for
 *   1 September - end of February ("51" September 2001, "02" March 2002, "52" September 2002 ... "00" September 2050).
 * - prefix format 1983-2001: a letter, 1-3 digits, three letters; the letter gives the registration year, from
 *   A = August 1983 - July 1984 to R = August 1997 - July 1998, then half years from S (August 1998 - February 1999)
 *   to Y (March - August 2001). I, O, Q, U and Z were not used.
 * - suffix format 1963-1983: three letters, 1-3 digits, a letter; A = 1963 ... Y = August 1982 - July 1983.
 * Marks of other shapes (dateless, Northern Ireland, personal numbers moved between cars) tell nothing of age.
 */

export type RegistrationFormat = 'uk' | 'none'

/** Upper case without spaces or dashes. */
export function normaliseRegistration(raw: string): string {
  return raw.replace(/[\s-]+/g, '').toUpperCase()
}

/** A mark of 2-8 letters and digits (international minimum; national rules are checked by {@link readRegistration}). */
export const REGISTRATION_SHAPE = /^[A-Z0-9]{2,8}$/

/** Why a normalised mark cannot be a registration, or null. */
export function registrationProblem(reg: string): string | null {
  if (!reg) return 'Enter the registration.'
  if (!/^[A-Z0-9]+$/.test(reg)) return 'A registration holds only letters and digits.'
  if (reg.length < 2 || reg.length > 8) return 'A registration has 2 to 8 letters and digits.'
  if (!/[0-9]/.test(reg)) return 'A registration has at least one digit.'
  return null
}

export interface RegistrationAge {
  format: 'current' | 'prefix' | 'suffix'
  /** the first and last month a mark of this age could be issued, 'YYYY-MM' */
  from: string
  to: string
}

const month = (y: number, m: number) => `${y}-${String(m).padStart(2, '0')}`

/** Age letters of the prefix format in order from A (1983) to R (1997), all issued in August for a year. */
const PREFIX_YEARLY = 'ABCDEFGHJKLMNPR'
/** The last half-yearly prefix letters: S Aug 1998 - Feb 1999, T Mar - Aug 1999, V, W, X, Y. */
const PREFIX_HALF: Record<string, [string, string]> = {
  S: ['1998-08', '1999-02'], T: ['1999-03', '1999-08'], V: ['1999-09', '2000-02'],
  W: ['2000-03', '2000-08'], X: ['2000-09', '2001-02'], Y: ['2001-03', '2001-08'],
}
/** Suffix letters: A = 1963 (from January), B 1964 ... F 1967 (to July); G from August 1968 yearly to Y 1982-83. */
const SUFFIX = 'ABCDEFGHJKLMNPRSTVWXY'

function suffixAge(letter: string): RegistrationAge | null {
  const i = SUFFIX.indexOf(letter)
  if (i < 0) return null
  if (letter <= 'D') return { format: 'suffix', from: month(1963 + i, 1), to: month(1963 + i, 12) }
  if (letter === 'E') return { format: 'suffix', from: '1967-01', to: '1967-07' }
  if (letter === 'F') return { format: 'suffix', from: '1967-08', to: '1968-07' }
  const year = 1968 + (i - SUFFIX.indexOf('G'))
  return { format: 'suffix', from: month(year, 8), to: month(year + 1, 7) }
}

/** When a UK mark was first issued, from its age identifier; null for marks that carry no age. */
export function ukRegistrationAge(reg: string): RegistrationAge | null {
  const current = /^[A-HJ-PR-Y][A-HJ-PR-Y]([0-9]{2})[A-HJ-PR-Z]{3}$/.exec(reg)
  if (current) {
    const n = Number(current[1])
    if (n === 1 || n === 50) return null // "01" and "50" were never issued
    if (n >= 2 && n <= 49) return { format: 'current', from: month(2000 + n, 3), to: month(2000 + n, 8) }
    const y = n === 0 ? 2050 : 2000 + n - 50 // "51" September 2001 ... "99" September 2049, "00" September 2050
    return { format: 'current', from: month(y, 9), to: month(y + 1, 2) }
  }
  const prefix = /^([A-HJ-NPR-TV-Y])[1-9][0-9]{0,2}[A-Z]{3}$/.exec(reg)
  if (prefix) {
    const l = prefix[1]!
    const i = PREFIX_YEARLY.indexOf(l)
    if (i >= 0) return { format: 'prefix', from: month(1983 + i, 8), to: month(1984 + i, 7) }
    const half = PREFIX_HALF[l]
    return half ? { format: 'prefix', from: half[0], to: half[1] } : null
  }
  const suffix = /^[A-Z]{3}[1-9][0-9]{0,2}([A-HJ-NPR-TV-Y])$/.exec(reg)
  if (suffix) return suffixAge(suffix[1]!)
  return null
}

/** The mark as people write it: the UK current format gets its space before the last three letters. */
export function displayRegistration(reg: string): string {
  const n = normaliseRegistration(reg)
  if (/^[A-Z]{2}[0-9]{2}[A-Z]{3}$/.test(n)) return `${n.slice(0, 4)} ${n.slice(4)}`
  const prefix = /^([A-Z][0-9]{1,3})([A-Z]{3})$/.exec(n)
  if (prefix) return `${prefix[1]} ${prefix[2]}`
  const suffix = /^([A-Z]{3})([0-9]{1,3}[A-Z])$/.exec(n)
  if (suffix) return `${suffix[1]} ${suffix[2]}`
  return n
}

/** The age a mark tells in the configured national format (null when it tells none). */
export function registrationAge(reg: string, format: RegistrationFormat): RegistrationAge | null {
  return format === 'uk' ? ukRegistrationAge(normaliseRegistration(reg)) : null
}

/**
 * Whether a new password is too easy to guess, by zxcvbn (@zxcvbn-ts) with its common-password list and keyboard
 * patterns, shipped with the app (nothing is looked up over the network). Length rules stay with the shared schema
 * (shared/schemas/accounts.ts, used by the forms too); this is the server's second look, before anything is hashed.
 * Plain Node.
 */
import { ZxcvbnFactory } from '@zxcvbn-ts/core'
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common'
import { invalidInput } from './errors'
import { securityEvent } from './security-log'

/**
 * zxcvbn's score 3 means "safely unguessable: moderate protection from an offline slow-hash scenario" (about 10^8
 * guesses, zxcvbn's own scale); below it the password is refused.
 */
export const MIN_SCORE = 3

let checker: ZxcvbnFactory | undefined

// zxcvbn's warning keys, in our words
const WHY: Record<string, string> = {
  topTen: 'is one of the most used passwords',
  topHundred: 'is one of the most used passwords',
  common: 'is a commonly used password',
  similarToCommon: 'is too close to a commonly used password',
  wordByItself: 'is a single word',
  namesByThemselves: 'is a name on its own',
  commonNames: 'is a common name',
  userInputs: 'contains your name, e-mail or business name',
  straightRow: 'is a row of keys',
  keyPattern: 'is a keyboard pattern',
  simpleRepeat: 'repeats the same characters',
  extendedRepeat: 'repeats the same characters',
  sequences: 'is a simple sequence',
  recentYears: 'is built on a recent year',
  dates: 'is built on a date',
}

/** Why this password is too easy to guess (a sentence for the person), or null when it will do. */
export function weakPasswordReason(password: string, hints: string[] = []): string | null {
  checker ??= new ZxcvbnFactory({ dictionary, graphs: adjacencyGraphs, maxLength: 128 })
  const inputs = hints.flatMap((h) => [h, ...h.toLowerCase().split(/[^a-z0-9]+/)]).filter((h) => h.length >= 3)
  const result = checker.check(password, inputs)
  // mostly the person's own words (NIST SP 800-63B 5.1.1.2: context-specific words), whatever the score says
  const ownWords = result.sequence.filter((m) => 'dictionaryName' in m && m.dictionaryName === 'userInputs').reduce((n, m) => n + m.token.length, 0)
  if (ownWords * 2 >= password.length) return `This password ${WHY.userInputs}. Choose a longer one that others could not guess, such as a few unrelated words.`
  if (result.score >= MIN_SCORE) return null
  const why = WHY[result.feedback.warning ?? ''] ?? 'is too easy to guess'
  return `This password ${why}. Choose a longer one that others could not guess, such as a few unrelated words.`
}

/** 422 on `field` when the password is too easy to guess; `hints` are the person's own words (name, e-mail). */
export function assertStrongPassword(password: string, field: string, hints: string[] = []): void {
  const why = weakPasswordReason(password, hints)
  if (!why) return
  securityEvent('password.refused_weak', { reason: field }, 'info')
  throw invalidInput({ [field]: why })
}

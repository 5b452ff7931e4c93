/**
 * Password hashing parameters, shared by nuxt-auth-utils (nuxt.config.ts) and the command-line scripts.
 * scrypt N = 2^17, r = 8, p = 1 as OWASP ASVS 5.0 asks. N*r*128 bytes = 128 MiB, so maxMemory must be
 * larger or verification silently fails.
 *
 * That memory is also why hashing is bounded here: 16 hashes at once took the server from 242 MB to 2.1 GB and
 * stalled every request. At most HASH_SLOTS run at once (each on a libuv thread); up to MAX_WAITING more wait
 * their turn for at most WAIT_MS; past that the answer is 503 "busy" with Retry-After, so no route can queue
 * unbounded scrypt work, whoever sends it.
 */
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { E_TIMEOUT, Semaphore, withTimeout } from 'async-mutex'
import { DomainError } from './errors'
import { securityEvent } from './security-log'

export const SCRYPT_OPTIONS = {
  cost: 2 ** 17,
  blockSize: 8,
  parallelization: 1,
  maxMemory: 256 * 1024 * 1024,
} as const

let hasher: Hash | undefined
const h = () => (hasher ??= new Hash(new Scrypt({ ...SCRYPT_OPTIONS })))

/** Hashes running at once (BORELINE_HASH_SLOTS overrides; each holds 128 MiB while it runs). */
export const HASH_SLOTS = Math.max(1, Number(process.env.BORELINE_HASH_SLOTS) || 2)
const MAX_WAITING = 64
const WAIT_MS = 30_000
let slots: Semaphore | undefined
let waiting = 0

function busy(): DomainError {
  securityEvent('hashing.busy', { reason: `${waiting} waiting` })
  return new DomainError('unavailable', 'The server is busy checking passwords. Please try again in a few seconds.', { retryAfterSeconds: 5 })
}

/** Runs one hash in a slot: waits its turn briefly, or 503 when too many are already waiting. */
async function inSlot<T>(work: () => Promise<T>): Promise<T> {
  if (waiting >= MAX_WAITING) throw busy()
  waiting++
  let release: (() => void) | undefined
  try {
    [, release] = await withTimeout((slots ??= new Semaphore(HASH_SLOTS)), WAIT_MS).acquire()
  } catch (err) {
    if (err === E_TIMEOUT) throw busy()
    throw err
  } finally {
    waiting--
  }
  try {
    return await work()
  } finally {
    release()
  }
}

/**
 * The same hash nuxt-auth-utils' `hashPassword` makes (same scrypt options, same format), without Nitro: for the
 * services and for scripts.
 */
export function hashPasswordOutsideNitro(password: string): Promise<string> {
  return inSlot(() => h().make(password))
}
export function verifyPasswordOutsideNitro(hash: string, password: string): Promise<boolean> {
  return inSlot(() => h().verify(hash, password))
}

/** Minimum rules for a password (ASVS: at least 10 characters here, by our own policy; no composition rules). */
export function passwordProblem(password: string): string | null {
  if (password.length < 10) return 'Password must be at least 10 characters.'
  if (password.length > 128) return 'Password must be at most 128 characters.'
  return null
}

/**
 * Password hashing parameters, shared by nuxt-auth-utils (nuxt.config.ts) and the command-line scripts.
 * scrypt N = 2^17, r = 8, p = 1 as OWASP ASVS 5.0 asks. N*r*128 bytes = 128 MiB, so maxMemory must be
 * larger or verification silently fails.
 */
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

export const SCRYPT_OPTIONS = {
  cost: 2 ** 17,
  blockSize: 8,
  parallelization: 1,
  maxMemory: 256 * 1024 * 1024,
} as const

let hasher: Hash | undefined
const h = () => (hasher ??= new Hash(new Scrypt({ ...SCRYPT_OPTIONS })))

/**
 * The same hash nuxt-auth-utils' `hashPassword` makes (same scrypt options, same format), without Nitro: for the
 * services and for scripts.
 */
export function hashPasswordOutsideNitro(password: string): Promise<string> {
  return h().make(password)
}
export function verifyPasswordOutsideNitro(hash: string, password: string): Promise<boolean> {
  return h().verify(hash, password)
}

/** Minimum rules for a password (ASVS: at least 10 characters here, by our own policy; no composition rules). */
export function passwordProblem(password: string): string | null {
  if (password.length < 10) return 'Password must be at least 10 characters.'
  if (password.length > 128) return 'Password must be at most 128 characters.'
  return null
}

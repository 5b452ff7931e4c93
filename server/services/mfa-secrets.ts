/**
 * TOTP secrets are kept sealed (AES-256-GCM): a copy of the database alone cannot produce codes. The key comes from
 * `NUXT_MFA_KEY` or, when that is not set, from the session password; either way through HKDF with a label of its
 * own, so it is never the cookie's key itself. Changing the key makes every enrolment unreadable (people then sign
 * in with a recovery code or have their second factor reset), so set NUXT_MFA_KEY once and keep it. Plain Node: the
 * seed and `user:create` seal secrets too.
 */
import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto'
import { DomainError } from './errors'

const VERSION = 'v1'
let key: Buffer | undefined

function sealingKey(): Buffer {
  if (key) return key
  const material = process.env.NUXT_MFA_KEY || process.env.NUXT_SESSION_PASSWORD
  if (!material || material.length < 32) {
    throw new DomainError('unavailable', 'Two-step sign-in is not set up on this server (NUXT_MFA_KEY, at least 32 characters, is missing).')
  }
  key = Buffer.from(hkdfSync('sha256', material, 'boreline', 'second-factor secrets', 32))
  return key
}

export function sealSecret(secret: string): string {
  const iv = randomBytes(12)
  const cipher = createCipheriv('aes-256-gcm', sealingKey(), iv)
  const body = Buffer.concat([cipher.update(secret, 'utf8'), cipher.final()])
  return `${VERSION}.${Buffer.concat([iv, cipher.getAuthTag(), body]).toString('base64url')}`
}

export function openSecret(sealed: string): string {
  const [version, data] = sealed.split('.')
  if (version !== VERSION || !data) throw new Error('unknown sealed secret format')
  const raw = Buffer.from(data, 'base64url')
  const decipher = createDecipheriv('aes-256-gcm', sealingKey(), raw.subarray(0, 12))
  decipher.setAuthTag(raw.subarray(12, 28))
  return Buffer.concat([decipher.update(raw.subarray(28)), decipher.final()]).toString('utf8')
}

/**
 * Time-based one-time codes, checked against RFC 6238 ("TOTP: Time-Based One-Time Password Algorithm"), Appendix B
 * "Test Vectors": 8-digit codes for the ASCII seeds "12345678901234567890" (HMAC-SHA-1, 20 bytes),
 * "12345678901234567890123456789012" (HMAC-SHA-256, 32 bytes) and the 64-byte
 * "1234567890123456789012345678901234567890123456789012345678901234" (HMAC-SHA-512), with T0 = 0 and X = 30 s.
 * Both the server's codes (otplib, server/services/totp.ts) and the tests' own (node:crypto, tests/support/totp.ts)
 * must give them.
 */
import { describe, expect, it } from 'vitest'
import { codeAt, matchingStep, newTotpSecret, otpauthUri, timeStepOf } from '../../../server/services/totp'
import { base32Bytes, codeAt as helperCodeAt } from '../../support/totp'

const SEEDS = {
  sha1: Buffer.from('12345678901234567890', 'ascii'),
  sha256: Buffer.from('12345678901234567890123456789012', 'ascii'),
  sha512: Buffer.from('1234567890123456789012345678901234567890123456789012345678901234', 'ascii'),
}

// RFC 6238 Appendix B, the table of "Time (sec)" and the TOTP for each mode
const VECTORS: [number, string, string, string][] = [
  [59, '94287082', '46119246', '90693936'],
  [1111111109, '07081804', '68084774', '25091201'],
  [1111111111, '14050471', '67062674', '99943326'],
  [1234567890, '89005924', '91819424', '93441116'],
  [2000000000, '69279037', '90698825', '38618901'],
  [20000000000, '65353130', '77737706', '47863826'],
]

describe('TOTP codes (RFC 6238 Appendix B test vectors)', () => {
  for (const [time, sha1, sha256, sha512] of VECTORS) {
    it(`gives the published codes at T = ${time} s`, async () => {
      expect(await codeAt(SEEDS.sha1, time, { digits: 8, algorithm: 'sha1' })).toBe(sha1)
      expect(await codeAt(SEEDS.sha256, time, { digits: 8, algorithm: 'sha256' })).toBe(sha256)
      expect(await codeAt(SEEDS.sha512, time, { digits: 8, algorithm: 'sha512' })).toBe(sha512)
      expect(helperCodeAt(SEEDS.sha1, time, 8, 'sha1')).toBe(sha1)
      expect(helperCodeAt(SEEDS.sha256, time, 8, 'sha256')).toBe(sha256)
      expect(helperCodeAt(SEEDS.sha512, time, 8, 'sha512')).toBe(sha512)
    })
  }

  it('uses 6 digits in the app: the last six of the same truncated value (RFC 4226 5.3: Snum mod 10^Digit)', async () => {
    for (const [time, sha1] of VECTORS) expect(await codeAt(SEEDS.sha1, time)).toBe(sha1.slice(-6))
  })

  it('reads base32 as RFC 4648 section 10 spells it ("foobar" is MZXW6YTBOI)', () => {
    expect(base32Bytes('MZXW6YTBOI').toString('ascii')).toBe('foobar')
    expect(base32Bytes('MZXW6YQ=').toString('ascii')).toBe('foob')
  })
})

describe('checking a code', () => {
  // a fixed moment in the middle of a step, and a secret of the app's own kind
  const now = 1_800_000_015
  const secret = newTotpSecret()
  const step = timeStepOf(now)

  it('makes 160-bit secrets (RFC 4226 section 4 recommends 160 bits), 32 base32 characters', () => {
    expect(secret).toMatch(/^[A-Z2-7]{32}$/)
    expect(base32Bytes(secret)).toHaveLength(20)
  })

  it('accepts the code of this step and of one step either side (clock drift), not two', async () => {
    for (const d of [-1, 0, 1]) expect(await matchingStep(secret, helperCodeAt(secret, now + d * 30), null, now)).toBe(step + d)
    for (const d of [-2, 2]) expect(await matchingStep(secret, helperCodeAt(secret, now + d * 30), null, now)).toBeNull()
  })

  it('refuses a code of a step already used, and earlier ones (RFC 6238 section 5.2: no second use)', async () => {
    const code = helperCodeAt(secret, now)
    expect(await matchingStep(secret, code, step, now)).toBeNull()
    expect(await matchingStep(secret, helperCodeAt(secret, now - 30), step, now)).toBeNull()
    expect(await matchingStep(secret, helperCodeAt(secret, now + 30), step, now)).toBe(step + 1)
  })

  it('refuses anything but six digits', async () => {
    for (const bad of ['', '12345', '1234567', 'abcdef', ' 123456']) expect(await matchingStep(secret, bad, null, now)).toBeNull()
  })

  it('writes the otpauth link authenticator apps read (issuer, account, secret)', () => {
    const uri = new URL(otpauthUri(secret, 'rowan.pike@kestrel-friction.test'))
    expect(uri.protocol).toBe('otpauth:')
    expect(uri.host).toBe('totp')
    expect(decodeURIComponent(uri.pathname)).toBe('/Boreline:rowan.pike@kestrel-friction.test')
    expect(uri.searchParams.get('secret')).toBe(secret)
    expect(uri.searchParams.get('issuer')).toBe('Boreline')
  })
})

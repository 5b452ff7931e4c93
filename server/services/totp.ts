/**
 * Time-based one-time codes (RFC 6238) through otplib: HMAC-SHA-1, 6 digits, 30-second steps, the settings every
 * authenticator app reads from an `otpauth://` link. A code is accepted one step either side of now (clock drift),
 * and only for a step later than the last one used, so the same code cannot be used twice. Plain Node: the demo
 * and test helpers compute codes with `codeAt` too.
 */
import { generate, generateSecret, generateURI, verify, type HashAlgorithm } from 'otplib'

export const TOTP_PERIOD = 30
export const TOTP_DIGITS = 6
/** one step either side of now */
export const TOTP_DRIFT_STEPS = 1
export const ISSUER = 'Boreline'

/** A new random secret: 20 bytes (160 bits, RFC 4226's recommended length), base32 as authenticator apps take it. */
export function newTotpSecret(): string {
  return generateSecret({ length: 20 })
}

/** The time step (RFC 6238's T) of a moment in seconds. */
export function timeStepOf(epochSeconds: number): number {
  return Math.floor(epochSeconds / TOTP_PERIOD)
}

/**
 * The code for `secret` at `epochSeconds`. `secret` is base32, or the raw key bytes; `digits` and `algorithm`
 * default to what the app uses (the other values exist for RFC 6238's published test vectors).
 */
export function codeAt(secret: string | Uint8Array, epochSeconds: number, options: { digits?: 6 | 7 | 8; algorithm?: HashAlgorithm } = {}): Promise<string> {
  return generate({ secret, epoch: epochSeconds, period: TOTP_PERIOD, digits: options.digits ?? TOTP_DIGITS, algorithm: options.algorithm ?? 'sha1' })
}

/**
 * The time step a code matches, within one step either side of now and after `afterStep` (the last step used),
 * or null when it matches none of them.
 */
export async function matchingStep(secret: string, code: string, afterStep: number | null, nowSeconds = Date.now() / 1000): Promise<number | null> {
  if (!/^\d{6}$/.test(code)) return null
  const r = await verify({
    secret, token: code, epoch: Math.floor(nowSeconds), period: TOTP_PERIOD, digits: TOTP_DIGITS,
    epochTolerance: TOTP_DRIFT_STEPS * TOTP_PERIOD, ...(afterStep !== null ? { afterTimeStep: afterStep } : {}),
  })
  // the result type covers counter-based codes too, which have no time step
  return r.valid && 'timeStep' in r ? r.timeStep : null
}

/** The `otpauth://` link an authenticator app reads from the QR code. */
export function otpauthUri(secret: string, account: string): string {
  return generateURI({ issuer: ISSUER, label: account, secret, period: TOTP_PERIOD, digits: TOTP_DIGITS })
}

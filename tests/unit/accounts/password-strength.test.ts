/**
 * New passwords too easy to guess are refused, by zxcvbn (@zxcvbn-ts with its common-password list) below score 3.
 * NIST SP 800-63B section 5.1.1.2 asks verifiers to compare new passwords with "passwords obtained from previous breach
 * corpuses", "dictionary words", "repetitive or sequential characters" and "context-specific words, such as the name
 * of the service, the username": one example of each below.
 */
import { describe, expect, it } from 'vitest'
import { assertStrongPassword, weakPasswordReason } from '../../../server/services/password-strength'

describe('password strength', () => {
  it.each([
    ['password123', /commonly used|most used|close to a commonly used/],
    ['1234567890', /most used|sequence/],
    ['aaaaaaaaaa', /repeats/],
    ['qwertyuiop', /most used|row of keys|keyboard/],
  ])('refuses %s, saying why', (password, why) => {
    expect(weakPasswordReason(password)).toMatch(why)
  })

  it('refuses a password built on the person\'s own name or e-mail', () => {
    expect(weakPasswordReason('hattiecorran1', ['hattie.corran@millbrook-motors.test', 'Hattie Corran'])).not.toBeNull()
    expect(weakPasswordReason('hattiecorran1')).toBeNull()
  })

  it('accepts long passphrases (the demo\'s and the tests\')', () => {
    for (const p of ['brake-demo-2026', 'long-enough-password', 'a-brand-new-password', 'copper rotor lantern gravel']) {
      expect(weakPasswordReason(p)).toBeNull()
    }
  })

  it('answers 422 on the field named', () => {
    expect(() => assertStrongPassword('password123', 'newPassword')).toThrow(expect.objectContaining({ kind: 'invalid', fields: { newPassword: expect.any(String) } }))
  })
})

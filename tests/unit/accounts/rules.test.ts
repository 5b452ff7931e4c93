import { describe, expect, it } from 'vitest'
import { createHash } from 'node:crypto'
import { TradeTermsSchema, DecisionSchema, InviteSchema, PasswordSchema, ProfileSchema, TierSchema, TradeApplicationSchema, percentToBp } from '#shared/schemas/accounts'
import { can } from '#shared/utils/abilities'
import { fieldMessages } from '../../../shared/utils/field-messages'
import { cleanFileName, proofPath } from '../../../server/services/proof-store'
import { countSignInAttempt, delayFor, forgetSignInFailures, FREE_FAILURES, MAX_DELAY_MS, SIGN_IN_LIMIT } from '../../../server/services/throttle'
import { escapeHtml } from '../../../server/services/account-mail'

describe('trade-account inputs', () => {
  it('needs passwords of at least 10 characters (our policy; OWASP ASVS 5.0 6.2.1 asks for at least 8, from memory)', () => {
    expect(PasswordSchema.safeParse('123456789').success).toBe(false)
    expect(PasswordSchema.safeParse('1234567890').success).toBe(true)
    expect(PasswordSchema.safeParse('x'.repeat(129)).success).toBe(false)
  })

  it('names every missing application field', () => {
    const r = TradeApplicationSchema.safeParse({})
    expect(r.success).toBe(false)
    expect(Object.keys(fieldMessages(r.error!.issues)).sort()).toEqual(['businessName', 'contactName', 'email', 'password', 'phone', 'taxNumber', 'tradingAddress'])
  })

  it('lower-cases and trims the e-mail so one address has one account', () => {
    const r = TradeApplicationSchema.parse({ businessName: 'Abc Motors', tradingAddress: '1 High Street, Town', taxNumber: 'GB 1234', contactName: 'A B', phone: '0161 555 0000', email: '  Someone@Example.TEST ', password: 'long-enough-1' })
    expect(r.email).toBe('someone@example.test')
  })

  it('turns percentages into basis points exactly (12.5 % = 1250 bp)', () => {
    expect(percentToBp(12.5)).toBe(1250)
    expect(percentToBp(7.25)).toBe(725)
    expect(percentToBp(0.01)).toBe(1)
    expect(percentToBp(33.33)).toBe(3333)
    expect(percentToBp(0.29)).toBe(29) // 0.29 * 100 is 28.999999999999996 in IEEE 754 doubles: rounding, not truncation
    expect(TierSchema.safeParse({ name: 'Odd', percent: 12.345 }).success).toBe(false)
    expect(TierSchema.safeParse({ name: 'Full', percent: 100 }).success).toBe(true)
    expect(TierSchema.safeParse({ name: 'Over', percent: 100.01 }).success).toBe(false)
  })

  it('keeps decisions consistent: account terms need a limit and days; card terms have neither', () => {
    expect(DecisionSchema.safeParse({ decision: 'approve', tierId: 1, homeBranchId: 1, terms: 'account', creditLimitMinor: 100_000, paymentDays: 30 }).success).toBe(true)
    expect(DecisionSchema.safeParse({ decision: 'approve', tierId: 1, homeBranchId: 1, terms: 'card' }).success).toBe(true)
    // the home branch that supplies the garage is part of the decision
    const noBranch = DecisionSchema.safeParse({ decision: 'approve', tierId: 1, terms: 'card' })
    expect(Object.keys(fieldMessages(noBranch.error!.issues))).toEqual(['homeBranchId'])
    const noLimit = DecisionSchema.safeParse({ decision: 'approve', tierId: 1, homeBranchId: 1, terms: 'account' })
    expect(Object.keys(fieldMessages(noLimit.error!.issues)).sort()).toEqual(['creditLimitMinor', 'paymentDays'])
    expect(DecisionSchema.safeParse({ decision: 'approve', tierId: 1, homeBranchId: 1, terms: 'card', paymentDays: 30 }).success).toBe(false)
    expect(DecisionSchema.safeParse({ decision: 'reject', reason: 'no' }).success).toBe(false)
    expect(DecisionSchema.safeParse({ decision: 'reject', reason: 'Tax number not valid.' }).success).toBe(true)
    expect(DecisionSchema.safeParse({ decision: 'approve', tierId: 1, homeBranchId: 1, terms: 'card', creditLimitMinor: 1.5 }).success).toBe(false)
    expect(TradeTermsSchema.safeParse({}).success).toBe(false)
  })

  it('refuses fields nobody may set, each named (mass assignment)', () => {
    const r = ProfileSchema.safeParse({ name: 'Fine Name', role: 'distributor_admin', status: 'approved', creditLimitMinor: 1 })
    expect(r.success).toBe(false)
    expect(fieldMessages(r.error!.issues)).toEqual({
      role: 'This field cannot be set here.', status: 'This field cannot be set here.', creditLimitMinor: 'This field cannot be set here.',
    })
    expect(InviteSchema.safeParse({ email: 'a@b.test', name: 'Al Bee', role: 'garage_technician', organisationId: 9 }).success).toBe(false)
  })
})

describe('abilities of the trade-account routes', () => {
  it('lets distributor staff read accounts and documents, only the admin decide', () => {
    expect(can('distributor_admin', 'tradeAccounts.view')).toBe(true)
    expect(can('counter_staff', 'tradeAccounts.view')).toBe(true)
    expect(can('garage_manager', 'tradeAccounts.view')).toBe(false)
    expect(can('garage_technician', 'tradeAccounts.view')).toBe(false)
    expect(can('counter_staff', 'tradeAccounts.decide')).toBe(false)
    expect(can('garage_technician', 'garage.staff')).toBe(false)
  })
})

describe('stored documents', () => {
  it('accepts only our own generated names inside the proofs folder', () => {
    const name = `${createHash('md5').update('x').digest('hex')}.pdf`
    expect(proofPath('/srv/uploads', name)).toBe(`/srv/uploads/proofs/${name}`)
    for (const bad of ['../../etc/passwd', 'a.pdf', `${'a'.repeat(32)}.php`, `../${'a'.repeat(32)}.pdf`, `${'a'.repeat(32)}.pdf/..`]) {
      expect(() => proofPath('/srv/uploads', bad), bad).toThrow()
    }
  })

  it('cleans the client\'s file name for display and download', () => {
    expect(cleanFileName('C:\\Users\\me\\scan "final".pdf')).toBe('scan final.pdf')
    expect(cleanFileName('../../x.pdf')).toBe('x.pdf')
    expect(cleanFileName('\u0000')).toBe('document')
  })

  it('escapes what people typed before it goes into an HTML e-mail', () => {
    expect(escapeHtml('<b>Joe\'s "Garage" & Co</b>')).toBe('&lt;b&gt;Joe&#39;s &quot;Garage&quot; &amp; Co&lt;/b&gt;')
  })
})

describe('sign-in throttle', () => {
  it('lets exactly 10 of 50 parallel attempts through for one e-mail from one address', async () => {
    const results = await Promise.all(Array.from({ length: 50 }, () => countSignInAttempt('victim@throttle.test', '10.0.0.1')))
    expect(results.filter((r) => r.ok)).toHaveLength(SIGN_IN_LIMIT.pointsPerPair)
    const refused = results.filter((r) => !r.ok) as { retryAfterSeconds: number }[]
    expect(refused).toHaveLength(40)
    for (const r of refused) expect(r.retryAfterSeconds).toBeGreaterThan(0)
    for (const r of refused) expect(r.retryAfterSeconds).toBeLessThanOrEqual(SIGN_IN_LIMIT.durationSeconds)
  })

  it('never locks an e-mail: 50 parallel attempts from 50 addresses all go through, each held a little longer', async () => {
    const results = await Promise.all(Array.from({ length: 50 }, (_, i) => countSignInAttempt('owner@throttle.test', `10.0.1.${i}`)))
    expect(results.every((r) => r.ok)).toBe(true)
    const delays = results.map((r) => (r.ok ? r.delayMs : -1)).sort((a, b) => a - b)
    expect(delays.slice(0, FREE_FAILURES)).toEqual([0, 0, 0, 0, 0])
    expect(delays.at(-1)).toBe(MAX_DELAY_MS)
  })

  it('rises from 0.25 s doubling to 8 s once an e-mail has failed 5 times (worked: 250 ms x 2^(n - 5))', () => {
    expect([0, 4, 5, 6, 7, 8, 9, 10, 11, 50].map(delayFor)).toEqual([0, 0, 250, 500, 1000, 2000, 4000, 8000, 8000, 8000])
  })

  it('lets exactly 30 of 50 parallel attempts through for one address, however many e-mails', async () => {
    const results = await Promise.all(Array.from({ length: 50 }, (_, i) => countSignInAttempt(`user${i}@spray.test`, '192.0.2.7')))
    expect(results.filter((r) => r.ok)).toHaveLength(SIGN_IN_LIMIT.pointsPerAddress)
  })

  it('gives the attempt back when the password was right', async () => {
    for (let i = 0; i < 30; i++) {
      const a = await countSignInAttempt('regular@throttle.test', '192.0.2.8')
      expect(a.ok).toBe(true)
      if (a.ok) {
        expect(a.delayMs).toBe(0)
        await a.release()
      }
    }
  })

  it('starts an e-mail afresh after a used reset link: no delay, every address may try again', async () => {
    for (let i = 0; i < 10; i++) await countSignInAttempt('forgetful@throttle.test', '192.0.2.9')
    expect((await countSignInAttempt('forgetful@throttle.test', '192.0.2.9')).ok).toBe(false)
    await forgetSignInFailures('forgetful@throttle.test')
    const again = await countSignInAttempt('forgetful@throttle.test', '192.0.2.9')
    expect(again).toMatchObject({ ok: true, delayMs: 0 })
  })
})

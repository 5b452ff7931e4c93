/**
 * Test cards and the test PaymentMethod ids that stand for them: which numbers pay, which are declined and why.
 */
import { unknownReference } from './errors'

export interface CardOutcome {
  brand: string
  last4: string
  ok: boolean
  code?: string
  declineCode?: string
  message?: string
}

export const DECLINED = 'Your card was declined.'

/** Test card numbers; the first three are the ones Boreline relies on (observed SDK/test-card facts). */
const TEST_CARDS: Record<string, Omit<CardOutcome, 'last4'>> = {
  '4242424242424242': { brand: 'visa', ok: true },
  '4000000000000002': { brand: 'visa', ok: false, code: 'card_declined', declineCode: 'generic_decline', message: DECLINED },
  '4000000000009995': {
    brand: 'visa', ok: false, code: 'card_declined', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.',
  },
  // API reference (from memory): further test cards
  '5555555555554444': { brand: 'mastercard', ok: true },
  '4000000000009987': { brand: 'visa', ok: false, code: 'card_declined', declineCode: 'lost_card', message: DECLINED },
  '4000000000000069': { brand: 'visa', ok: false, code: 'expired_card', declineCode: 'expired_card', message: 'Your card has expired.' },
}

// API reference (from memory): test PaymentMethod ids that stand for the cards above
const TEST_PAYMENT_METHODS: Record<string, string> = {
  pm_card_visa: '4242424242424242',
  pm_card_mastercard: '5555555555554444',
  pm_card_chargeDeclined: '4000000000000002',
  pm_card_chargeDeclinedInsufficientFunds: '4000000000009995',
  pm_card_chargeDeclinedLostCard: '4000000000009987',
  pm_card_chargeDeclinedExpiredCard: '4000000000000069',
}

/** Luhn check digit test, the checksum every card number carries (ISO/IEC 7812-1). */
function luhnValid(digits: string): boolean {
  let sum = 0
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i])
    if (i % 2 === 1) {
      d *= 2
      if (d > 9) d -= 9
    }
    sum += d
  }
  return sum % 10 === 0
}

/** Returns null for a number that is not a card number at all (wrong length or checksum). */
export function classifyCard(input: string): CardOutcome | null {
  const digits = input.replace(/[\s-]/g, '')
  if (!/^\d{12,19}$/.test(digits) || !luhnValid(digits)) return null
  const known = TEST_CARDS[digits]
  const last4 = digits.slice(-4)
  if (known) return { ...known, last4 }
  // API reference (from memory): a real card number in test mode is declined with test_mode_live_card
  return {
    brand: 'unknown', last4, ok: false, code: 'card_declined', declineCode: 'test_mode_live_card',
    message: 'Your card was declined. This is a test environment: use a test card number.',
  }
}

/** The card a test PaymentMethod id stands for; any other id is unknown here. */
export function cardOfPaymentMethod(id: string): CardOutcome {
  const number = TEST_PAYMENT_METHODS[id]
  if (!number) throw unknownReference('PaymentMethod', id, 'payment_method')
  return classifyCard(number) as CardOutcome
}

import { describe, expect, it } from 'vitest'
import {
  QUOTE_STATUSES, canMoveQuote, decisionEvent, effectiveQuoteStatus, nextQuoteStatus, quoteAwaitsOwner, quoteEditMode,
  type QuoteEvent, type QuoteStatus,
} from '#shared/utils/quote-states'

const EVENTS: QuoteEvent[] = ['send', 'approve_all', 'approve_some', 'decline_all', 'expire', 'supersede']

describe('quote states', () => {
  it('follows draft -> sent -> approved / partly approved / declined, and sent -> expired', () => {
    expect(nextQuoteStatus('draft', 'send')).toBe('sent')
    expect(nextQuoteStatus('sent', 'approve_all')).toBe('approved')
    expect(nextQuoteStatus('sent', 'approve_some')).toBe('partly_approved')
    expect(nextQuoteStatus('sent', 'decline_all')).toBe('declined')
    expect(nextQuoteStatus('sent', 'expire')).toBe('expired')
    expect(nextQuoteStatus('sent', 'send')).toBe('sent') // a new link
  })

  it('lets every state after sending be replaced by a revision, and nothing leave superseded', () => {
    for (const s of ['sent', 'approved', 'partly_approved', 'declined', 'expired'] as QuoteStatus[]) {
      expect(nextQuoteStatus(s, 'supersede')).toBe('superseded')
      expect(quoteEditMode(s)).toBe('new_revision')
    }
    expect(quoteEditMode('draft')).toBe('in_place')
    expect(quoteEditMode('superseded')).toBe('locked')
    for (const e of EVENTS) expect(nextQuoteStatus('superseded', e)).toBeNull()
  })

  it('refuses the forbidden moves', () => {
    const forbidden: [QuoteStatus, QuoteStatus][] = [
      ['draft', 'approved'], ['draft', 'partly_approved'], ['draft', 'declined'], ['draft', 'expired'], ['draft', 'superseded'],
      ['approved', 'sent'], ['approved', 'declined'], ['approved', 'draft'], ['declined', 'approved'], ['declined', 'sent'],
      ['partly_approved', 'approved'], ['expired', 'approved'], ['expired', 'sent'], ['superseded', 'draft'], ['superseded', 'sent'],
      ['sent', 'draft'],
    ]
    for (const [from, to] of forbidden) expect(canMoveQuote(from, to), `${from} -> ${to}`).toBe(false)
    expect(nextQuoteStatus('draft', 'approve_all')).toBeNull()
    expect(nextQuoteStatus('declined', 'approve_some')).toBeNull()
    expect(nextQuoteStatus('approved', 'expire')).toBeNull()
    expect(nextQuoteStatus('draft', 'expire')).toBeNull()
  })

  it('has exactly the listed moves (a table check over every pair)', () => {
    const allowed = new Set(['draft>sent', 'sent>sent', 'sent>approved', 'sent>partly_approved', 'sent>declined', 'sent>expired',
      'sent>superseded', 'approved>superseded', 'partly_approved>superseded', 'declined>superseded', 'expired>superseded'])
    for (const from of QUOTE_STATUSES) for (const to of QUOTE_STATUSES) {
      expect(canMoveQuote(from, to), `${from} -> ${to}`).toBe(allowed.has(`${from}>${to}`))
    }
  })

  it('names the outcome of an owner decision', () => {
    expect(decisionEvent(3, 3)).toBe('approve_all')
    expect(decisionEvent(1, 3)).toBe('approve_some')
    expect(decisionEvent(0, 3)).toBe('decline_all')
    expect(quoteAwaitsOwner('sent')).toBe(true)
    expect(quoteAwaitsOwner('approved')).toBe(false)
  })

  it('counts a sent quote past its validity as expired', () => {
    const now = new Date('2026-12-01T12:00:00Z')
    expect(effectiveQuoteStatus('sent', '2026-12-01T12:00:00Z', now)).toBe('expired')
    expect(effectiveQuoteStatus('sent', '2026-12-01T12:00:01Z', now)).toBe('sent')
    expect(effectiveQuoteStatus('approved', '2026-11-01T00:00:00Z', now)).toBe('approved')
    expect(effectiveQuoteStatus('draft', null, now)).toBe('draft')
  })
})

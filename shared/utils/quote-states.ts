/**
 * The life of a quote. Only these moves exist; anything else is refused by the server (409):
 *
 *   draft ──send──> sent ──owner decides──> approved | partly_approved | declined
 *                    │ └──validity runs out──> expired
 *                    └──(re)send: a new link, the old one stops working (sent -> sent)
 *   sent, approved, partly_approved, declined, expired ──a change──> superseded (a new draft revision takes over)
 *
 * A draft is changed in place; every other state is fixed, and changing it makes a new revision.
 * superseded is final.
 */

export const QUOTE_STATUSES = ['draft', 'sent', 'approved', 'partly_approved', 'declined', 'expired', 'superseded'] as const
export type QuoteStatus = (typeof QUOTE_STATUSES)[number]

export type QuoteEvent = 'send' | 'approve_all' | 'approve_some' | 'decline_all' | 'expire' | 'supersede'

const MOVES: Record<QuoteStatus, Partial<Record<QuoteEvent, QuoteStatus>>> = {
  draft: { send: 'sent' },
  sent: { send: 'sent', approve_all: 'approved', approve_some: 'partly_approved', decline_all: 'declined', expire: 'expired', supersede: 'superseded' },
  approved: { supersede: 'superseded' },
  partly_approved: { supersede: 'superseded' },
  declined: { supersede: 'superseded' },
  expired: { supersede: 'superseded' },
  superseded: {},
}

/** Where `event` takes a quote in `status`, or null when that move is not allowed. */
export function nextQuoteStatus(status: QuoteStatus, event: QuoteEvent): QuoteStatus | null {
  return MOVES[status]?.[event] ?? null
}

/** Whether a quote may go straight from one status to another. */
export function canMoveQuote(from: QuoteStatus, to: QuoteStatus): boolean {
  return Object.values(MOVES[from] ?? {}).includes(to)
}

/** Changed in place (draft) or through a new revision (anything decided, sent or expired), or not at all. */
export function quoteEditMode(status: QuoteStatus): 'in_place' | 'new_revision' | 'locked' {
  if (status === 'draft') return 'in_place'
  return nextQuoteStatus(status, 'supersede') ? 'new_revision' : 'locked'
}

/** The owner can still decide (a live link). */
export function quoteAwaitsOwner(status: QuoteStatus): boolean {
  return status === 'sent'
}

/** The outcome of an owner's choices over the lines offered. */
export function decisionEvent(approved: number, offered: number): QuoteEvent {
  if (offered > 0 && approved === offered) return 'approve_all'
  if (approved === 0) return 'decline_all'
  return 'approve_some'
}

/** Our words for the states (the garage's screens, the owner's page and the PDF). */
export const QUOTE_STATUS_LABELS: Record<QuoteStatus, string> = {
  draft: 'Being written',
  sent: 'With the owner',
  approved: 'Approved',
  partly_approved: 'Partly approved',
  declined: 'Declined',
  expired: 'Expired',
  superseded: 'Replaced by a newer revision',
}

/** Sent quotes past their validity are expired; everything else keeps its stored status. */
export function effectiveQuoteStatus(status: QuoteStatus, expiresAt: Date | string | null, now = new Date()): QuoteStatus {
  if (status === 'sent' && expiresAt && new Date(expiresAt).getTime() <= now.getTime()) return 'expired'
  return status
}

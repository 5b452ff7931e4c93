/**
 * What names a quote: its number within the garage, the reference people read ("Q-0042 rev 2"), the PDF's file
 * name, and the owner's link token (32 random bytes; only the SHA-256 is stored, so a leaked table opens nothing).
 */
import { createHash, randomBytes } from 'node:crypto'
import type { Transaction } from 'sequelize'
import { Quote } from '../../models/quotes'
import { DomainError } from '../errors'
import { lockRow } from '../../utils/sql'

export function quoteReference(q: Pick<Quote, 'number' | 'revision'>): string {
  return `Q-${String(q.number).padStart(4, '0')}${q.revision > 1 ? ` rev ${q.revision}` : ''}`
}

export function quotePdfName(q: Pick<Quote, 'number' | 'revision'>): string {
  return `quote-${quoteReference(q).replace(/\s+/g, '-').toLowerCase()}.pdf`
}

/** The next number in the garage's own sequence (revisions keep their quote's number). */
export async function nextQuoteNumber(t: Transaction, organisationId: number): Promise<number> {
  await lockRow(t, 'organisations', organisationId) // PostgreSQL: a concurrent quote of this garage waits for this number
  const max = await Quote.max<number, Quote>('number', { where: { organisationId }, transaction: t })
  return (Number(max) || 0) + 1
}

/** 256 bits for the owner's link; only the hash is kept. */
export function newQuoteToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashQuoteToken(token) }
}

export function hashQuoteToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

/**
 * The one answer for a wrong, expired or unknown owner's link: the same words whatever the reason, so a link
 * never tells whether a quote exists.
 */
export function linkNotValid(): DomainError {
  return new DomainError('not_found', 'This link is not valid.')
}

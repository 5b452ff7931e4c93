/**
 * Single-use links (password reset, staff invitation). The token goes out in the e-mail only; the database
 * keeps its SHA-256, so a copy of the database cannot be turned into working links. Using a token is one
 * guarded UPDATE (`used_at IS NULL AND expires_at > now`), so two clicks cannot both succeed.
 */
import { createHash, randomBytes } from 'node:crypto'
import { Op, type Transaction } from 'sequelize'
import { AccountToken, type AccountTokenKind } from '../models/accounts-extra'
import { DomainError } from './errors'

export const TOKEN_LIFETIME_MS: Record<AccountTokenKind, number> = {
  reset: 60 * 60 * 1000, // one hour
  invite: 7 * 24 * 60 * 60 * 1000, // a week: people are invited before they start
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

/** Issues a new token of this kind for the user; earlier unused ones of the same kind stop working. */
export async function issueToken(t: Transaction, userId: number, kind: AccountTokenKind, createdByUserId: number | null = null): Promise<string> {
  const now = new Date()
  await AccountToken.update({ usedAt: now }, { where: { userId, kind, usedAt: null }, transaction: t })
  const token = randomBytes(32).toString('base64url')
  await AccountToken.create({
    userId, kind, tokenHash: hashToken(token), createdByUserId,
    expiresAt: new Date(now.getTime() + TOKEN_LIFETIME_MS[kind]),
  }, { transaction: t })
  return token
}

/** The live token row (unused, unexpired) for this token, or null. Read-only: for showing the form. */
export async function findLiveToken(token: string, kind: AccountTokenKind): Promise<AccountToken | null> {
  return AccountToken.findOne({
    where: { tokenHash: hashToken(token), kind, usedAt: null, expiresAt: { [Op.gt]: new Date() } },
  })
}

/** Marks the token used inside the caller's write transaction; returns the row, or null when it was not live. */
export async function useToken(t: Transaction, token: string, kind: AccountTokenKind): Promise<AccountToken | null> {
  const now = new Date()
  const where = { tokenHash: hashToken(token), kind, usedAt: null, expiresAt: { [Op.gt]: now } }
  const row = await AccountToken.findOne({ where, transaction: t })
  if (!row) return null
  const [changed] = await AccountToken.update({ usedAt: now }, { where: { id: row.id, usedAt: null }, transaction: t })
  return changed === 1 ? row : null
}

/** Voids every open link of these users (e.g. when someone is removed). */
export async function voidTokensOf(t: Transaction, userIds: number[]): Promise<void> {
  if (!userIds.length) return
  await AccountToken.update({ usedAt: new Date() }, { where: { userId: { [Op.in]: userIds }, usedAt: null }, transaction: t })
}

export const DEAD_LINK_MESSAGE = 'This link has expired or has already been used. Ask for a new one.'

/** 410: the link is expired, used, unknown, or its person is no longer who it was made for. */
export function deadLink(): DomainError {
  return new DomainError('gone', DEAD_LINK_MESSAGE)
}

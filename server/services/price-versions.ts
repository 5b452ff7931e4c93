/**
 * The active price version: the one query every reader uses (prices for quotes and orders, the catalogue's pricing
 * context, the price-file check, apply, roll back and their pages). A unique index keeps at most one row active, so
 * the order only makes the answer deterministic should that ever not hold. Raw SQL on the one connection, so scripts
 * and the server read it alike, inside a transaction when one is given. Plain Node.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { getDb } from '../utils/db'

export interface ActivePriceVersion { id: number; version: number }

/** The price version in use, or null before any price file has been applied. */
export async function activePriceVersion(transaction?: Transaction): Promise<ActivePriceVersion | null> {
  const [row] = await getDb().query<{ id: number; version: number }>(
    `SELECT id, version FROM price_versions WHERE status = 'active' ORDER BY version DESC, id DESC LIMIT 1`,
    { type: QueryTypes.SELECT, transaction },
  )
  return row ? { id: Number(row.id), version: Number(row.version) } : null
}

/** The id of the price version in use (null: none yet). */
export async function activePriceVersionId(transaction?: Transaction): Promise<number | null> {
  return (await activePriceVersion(transaction))?.id ?? null
}

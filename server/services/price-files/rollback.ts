/**
 * Rolling back an applied price file, in ONE write transaction: the version that was in use before it is active
 * again with exactly its prices (the apply recorded every value it replaced, and only price files change prices),
 * and the part statuses the apply changed are undone. Only the version in use can be rolled back.
 */
import { getDb, withWrite } from '../../utils/db'
import { jsonAt } from '../../utils/sql'
import { audit } from '../../utils/audit'
import { PriceVersion } from '../../models/catalogue'
import { PriceFile } from '../../models/price-files'
import { activePriceVersionId } from '../price-versions'
import { conflict, notFound } from '../errors'
import { findingsOf } from './findings'
import { recorded, sqlDate, versionNumberOf } from './versions'
import { noticeRollback } from './admin-notices'
import { cancelSchedule } from './schedule'
import { refreshSnapshot } from './snapshot'

export interface RollbackOutcome { status: 'rolled_back'; version: number; activeVersion: number }

/** Takes a price file out of use: a scheduled one is unscheduled (it can be applied again), an applied one rolled back. */
export async function withdrawPriceFile(priceFile: PriceFile, userId: number, opts: { failMidway?: boolean } = {}): Promise<RollbackOutcome | { status: 'ready' }> {
  if (priceFile.status !== 'scheduled') return rollbackPriceFile(priceFile.id, userId, opts)
  await cancelSchedule(priceFile.id, userId)
  return { status: 'ready' }
}

/** Makes the version that was active before this file active again; undoes the part statuses it changed. */
export async function rollbackPriceFile(priceFileId: number, userId: number, opts: { failMidway?: boolean } = {}): Promise<RollbackOutcome> {
  const result = await withWrite(async (t) => {
    const priceFile = await PriceFile.findByPk(priceFileId, { transaction: t })
    if (!priceFile) throw notFound('Price file')
    if (priceFile.status === 'scheduled') throw conflict('This file is scheduled, not applied: cancel the schedule instead.')
    if (priceFile.status !== 'applied' || !priceFile.priceVersionId) throw conflict('Only an applied price file can be rolled back.')
    const made = await PriceVersion.findByPk(priceFile.priceVersionId, { transaction: t })
    if (!made || made.status !== 'active') {
      const active = await versionNumberOf(await activePriceVersionId(t), t)
      throw conflict(`Version ${made?.version ?? '?'} is not the one in use (version ${active ?? 'none'} is). Only the version in use can be rolled back.`)
    }
    const prev = priceFile.previousPriceVersionId ? await PriceVersion.findByPk(priceFile.previousPriceVersionId, { transaction: t }) : null
    if (!prev) throw conflict('This was the first price version: there is no earlier version to return to.')
    const now = sqlDate(new Date())
    const q = (sql: string, bind: unknown[]) => getDb().query(sql, { bind, transaction: t })
    await q(`UPDATE price_versions SET status = 'retired', updated_at = $2 WHERE id = $1`, [made.id, now])
    if (opts.failMidway) throw new Error('test hook: rollback stopped midway')
    await q(`UPDATE price_versions SET status = 'active', activated_at = $2, updated_at = $2 WHERE id = $1`, [prev.id, now])
    // the prices this file replaced, exactly as they were ('prices': [part, new list, trade, core, pack, old list,
    // trade, core, pack, old version]); parts it priced for the first time lose that price
    const v = (i: number) => jsonAt('b.v', i, 'int')
    await q(`UPDATE part_prices SET list_price_minor = ${v(5)}, trade_cost_minor = ${v(6)}, core_deposit_minor = COALESCE(${v(7)}, 0),
                    pack_quantity = COALESCE(${v(8)}, 1), price_version_id = ${v(9)}
               FROM ${findingsOf(['prices'])} b WHERE part_prices.part_id = ${v(0)} AND ${v(5)} IS NOT NULL AND ${v(9)} IS NOT NULL`, [priceFile.id])
    await q(`DELETE FROM part_prices WHERE part_id IN (SELECT ${v(0)} FROM ${findingsOf(['prices'])} b WHERE ${v(5)} IS NULL OR ${v(9)} IS NULL)
                OR part_id IN (${recorded('created')})`, [priceFile.id])
    await q(`UPDATE parts SET status = 'active', updated_at = $2 WHERE id IN (${recorded('discontinued')})`, [priceFile.id, now])
    // parts this file created or brought back have no price in the earlier version: out of use again
    await q(`UPDATE parts SET status = 'discontinued', updated_at = $2 WHERE id IN (${recorded('created')}) OR id IN (${recorded('reactivated')})`, [priceFile.id, now])
    await priceFile.update({ status: 'rolled_back', rolledBackAt: new Date(), rolledBackByUserId: userId }, { transaction: t })
    await audit(t, {
      actorUserId: userId, action: 'priceVersion.rollback', entity: 'price_version', entityId: made.id,
      changes: { priceFileId: priceFile.id, version: made.version, activeAgain: prev.version },
    })
    return { priceFile, version: made.version, activeVersion: prev.version }
  })
  refreshSnapshot()
  await noticeRollback({ ...result, userId })
  return { status: 'rolled_back', version: result.version, activeVersion: result.activeVersion }
}

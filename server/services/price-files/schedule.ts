/**
 * Price versions scheduled for a chosen time: cancelled on request, made active when their time comes (a timer
 * set when scheduling, and the periodic sweep of the price-files plugin as the fallback). A scheduled file whose
 * base version is no longer in use at that time is not applied: it goes back to `ready` to be checked again.
 */
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { PriceVersion } from '../../models/catalogue'
import { PriceFile } from '../../models/price-files'
import { activePriceVersionId } from '../price-versions'
import { conflict, notFound } from '../errors'
import { buildVersion, countsFor, dropReservedVersion, versionNumberOf } from './versions'
import { afterApply } from './admin-notices'
import { refreshSnapshot } from './snapshot'

/** Cancels a scheduled apply: the reserved version disappears and the file can be applied again. */
export async function cancelSchedule(priceFileId: number, userId: number): Promise<void> {
  await withWrite(async (t) => {
    const priceFile = await PriceFile.findByPk(priceFileId, { transaction: t })
    if (!priceFile) throw notFound('Price file')
    if (priceFile.status !== 'scheduled') throw conflict('This price file is not scheduled.')
    const version = await versionNumberOf(priceFile.priceVersionId, t)
    const reserved = priceFile.priceVersionId
    await priceFile.update({ status: 'ready', priceVersionId: null, effectiveAt: null, appliedByUserId: null }, { transaction: t })
    // the file no longer points at the reserved version, so it can go (it has no rows)
    if (reserved) await dropReservedVersion(t, reserved)
    await audit(t, { actorUserId: userId, action: 'priceVersion.unschedule', entity: 'price_file', entityId: priceFile.id, changes: { version } })
  })
}

/** Activates scheduled versions whose time has come. Called by a timer and at start. */
export async function activateDue(now = new Date()): Promise<number> {
  const due = await PriceFile.findAll({ where: { status: 'scheduled' }, order: [['effectiveAt', 'ASC']] })
  let done = 0
  for (const priceFile of due) {
    if (!priceFile.effectiveAt || priceFile.effectiveAt.getTime() > now.getTime()) continue
    let applied = false
    try {
      applied = await activateOne(priceFile.id)
    } catch (err) {
      console.error('[boreline] scheduled price version could not be applied:', (err as Error).message)
      await withWrite((t) => PriceFile.update(
        { errorMessage: `The scheduled apply failed and was undone: ${(err as Error).message}` },
        { where: { id: priceFile.id }, transaction: t },
      )).catch(() => {})
    }
    if (applied) {
      done++
      refreshSnapshot()
      await afterApply(priceFile.id).catch((e) => console.error('[boreline] after-apply work failed:', e))
    }
  }
  return done
}

/** Applies one scheduled file in its own transaction; false when it was not applied. */
async function activateOne(priceFileId: number): Promise<boolean> {
  return withWrite(async (t) => {
    // locked on PostgreSQL: a sweep in another process waits here, then finds it no longer scheduled
    const fresh = await PriceFile.findByPk(priceFileId, { transaction: t, lock: true })
    if (!fresh || fresh.status !== 'scheduled' || !fresh.priceVersionId) return false
    const reserved = await PriceVersion.findByPk(fresh.priceVersionId, { transaction: t })
    const active = await activePriceVersionId(t)
    if (!reserved || active !== (fresh.basePriceVersionId ?? null)) {
      await fresh.update({
        status: 'ready', priceVersionId: null,
        errorMessage: 'Not applied at the scheduled time: the prices in use had changed since the check. Check the file again and apply it.',
      }, { transaction: t })
      if (reserved) await dropReservedVersion(t, reserved.id)
      return false
    }
    const previous = await buildVersion(t, fresh, reserved, { missingParts: fresh.missingAction })
    await fresh.update({ status: 'applied', previousPriceVersionId: previous, appliedAt: new Date() }, { transaction: t })
    await audit(t, {
      actorUserId: fresh.appliedByUserId ?? null, action: 'priceVersion.apply', entity: 'price_version', entityId: reserved.id,
      changes: { priceFileId: fresh.id, version: reserved.version, previousPriceVersionId: previous, scheduledFor: fresh.effectiveAt?.toISOString(), ...countsFor(fresh) },
    })
    return true
  }, { referencesProvedByCaller: true }) // buildVersion proves what it writes (versions.ts, proveReferences)
}

let timer: ReturnType<typeof setTimeout> | undefined
/** Wakes the scheduler right at a scheduled time (the periodic sweep is the fallback). */
export function armTimer(at: Date): void {
  const ms = at.getTime() - Date.now()
  if (ms > 24 * 3600_000) return
  if (timer) clearTimeout(timer)
  timer = setTimeout(() => { activateDue().catch((e) => console.error('[boreline] price schedule:', e)) }, Math.max(0, ms) + 50)
  timer.unref?.()
}

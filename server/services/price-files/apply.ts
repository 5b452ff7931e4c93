/**
 * Applying a checked price file, now or at a chosen time, in ONE write transaction (all rows or none): parts,
 * prices, stock and version status change together; if anything throws, the previous version stays active and
 * untouched (the writes themselves: versions.ts).
 *
 * An apply is refused unless the version the check compared with is still in use (a file checked against an older
 * version must be checked again), and while a version is scheduled no other file is applied: two files never mix.
 */
import type { Transaction } from 'sequelize'
import { isPostgres, withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { PriceFile } from '../../models/price-files'
import type { MissingAction } from '../../../shared/types/price-files'
import { activePriceVersionId } from '../price-versions'
import { DomainError, conflict, isDomainError, notFound } from '../errors'
import { buildVersion, countsFor, reserveVersion, versionNumberOf } from './versions'
import { afterApply } from './admin-notices'
import { armTimer } from './schedule'
import { rememberMapping } from './supplier-mappings'
import { refreshSnapshot } from './snapshot'

export interface ApplyRequest {
  priceFileId: number
  userId: number
  excludeRejected: boolean
  confirmLargeChanges: boolean
  effectiveAt: Date | null
  missingParts: MissingAction
  /** test-only: throw inside the transaction after the new rows are written (BORELINE_TEST_HOOKS=1) */
  failMidway?: boolean
}

export interface ApplyOutcome {
  status: 'applied' | 'scheduled'
  priceFileId: number
  priceVersionId: number
  version: number
  effectiveAt: string | null
}

function statusRefusal(priceFile: PriceFile, version: number | null): DomainError | null {
  switch (priceFile.status) {
    case 'ready': return null
    case 'uploaded': return conflict('Choose the columns first: this file has not been checked yet.')
    case 'parsing': return conflict('This file is still being checked. Wait for the check to finish.')
    case 'failed': return conflict('This file could not be read, so it cannot be applied. Upload a corrected file.')
    case 'applying': return conflict('This file is being applied right now.')
    case 'applied': return conflict(`This file has already been applied${version ? ` as version ${version}` : ''}.`)
    case 'scheduled': return conflict(`This file is already scheduled${version ? ` as version ${version}` : ''}.`)
    case 'rolled_back': return conflict('This file was applied and then rolled back. Upload it again to apply it again.')
    default: return conflict('This file cannot be applied now.')
  }
}

/** The person's confirmations and the time asked for: a message on each field at fault. */
function confirmationsMissing(priceFile: PriceFile, req: ApplyRequest): Record<string, string> {
  const fields: Record<string, string> = {}
  const { countRejected: rejected, countLarge: large } = priceFile
  if (rejected > 0 && !req.excludeRejected) {
    fields.excludeRejected = `${rejected} ${rejected === 1 ? 'row was' : 'rows were'} refused. Fix the file and upload it again, or tick “apply without the refused rows”.`
  }
  if (large > 0 && !req.confirmLargeChanges) {
    fields.confirmLargeChanges = `${large} ${large === 1 ? 'price moves' : 'prices move'} by more than 30 %. Look at them and confirm them before applying.`
  }
  if (req.effectiveAt && req.effectiveAt.getTime() < Date.now() - 5 * 60_000) {
    fields.effectiveAt = 'That time is in the past. Leave it empty to apply now, or choose a later time.'
  }
  if (req.effectiveAt && req.effectiveAt.getTime() > Date.now() + 366 * 24 * 3600_000) {
    fields.effectiveAt = 'Choose a time within the next twelve months.'
  }
  return fields
}

/** Everything that must hold for an apply; checked again inside the transaction that applies. */
async function guardApply(priceFile: PriceFile, req: ApplyRequest, t: Transaction): Promise<void> {
  const s = statusRefusal(priceFile, await versionNumberOf(priceFile.priceVersionId, t))
  if (s) throw s
  const fields = confirmationsMissing(priceFile, req)
  if (Object.keys(fields).length) throw new DomainError('invalid', Object.values(fields).join(' '), { fields })
  if (priceFile.countNew + priceFile.countChanged + priceFile.countUnchanged === 0) {
    const message = 'No row of this file can be applied: every row was refused.'
    throw new DomainError('invalid', message, { fields: { excludeRejected: message } })
  }
  const active = await activePriceVersionId(t)
  if (active !== (priceFile.basePriceVersionId ?? null)) {
    throw conflict(`The prices in use changed after this file was checked (version ${await versionNumberOf(active, t) ?? 'none'} is in use now). Check the file again before applying it.`)
  }
  const other = await PriceFile.findOne({ where: { status: 'scheduled' }, transaction: t })
  if (other && other.id !== priceFile.id) {
    const v = await versionNumberOf(other.priceVersionId, t)
    throw conflict(`Version ${v ?? '?'} is scheduled for ${other.effectiveAt?.toISOString() ?? 'later'}. Cancel that schedule before applying another price file.`)
  }
}

/**
 * Apply now, or schedule when `effectiveAt` is more than a few seconds ahead. The supplier's column mapping is
 * remembered for their next file once the apply is accepted.
 */
export async function applyPriceFile(req: ApplyRequest): Promise<ApplyOutcome> {
  const scheduled = !!req.effectiveAt && req.effectiveAt.getTime() > Date.now() + 5_000
  // 1) claim the file (a second click, or a second person, is refused while this one runs)
  const claimed = await withWrite(async (t) => {
    const priceFile = await PriceFile.findByPk(req.priceFileId, { transaction: t })
    if (!priceFile) throw notFound('Price file')
    await guardApply(priceFile, req, t)
    if (!scheduled) await priceFile.update({ status: 'applying', errorMessage: null }, { transaction: t })
    return priceFile
  })
  const outcome = scheduled ? await schedule(req) : await applyNow(req)
  if (claimed.supplierName && claimed.mapping) {
    await rememberMapping(claimed.supplierName, claimed.mapping, claimed.delimiterChosen ? claimed.delimiter : null, claimed.decimalMark, req.userId).catch(() => {})
  }
  return outcome
}

async function schedule(req: ApplyRequest): Promise<ApplyOutcome> {
  const outcome = await withWrite(async (t) => {
    const priceFile = (await PriceFile.findByPk(req.priceFileId, { transaction: t }))!
    await guardApply(priceFile, req, t)
    const reserved = await reserveVersion(t, priceFile, req.userId, req.effectiveAt)
    await priceFile.update({
      status: 'scheduled', priceVersionId: reserved.id, effectiveAt: req.effectiveAt, missingAction: req.missingParts,
      excludeRejected: req.excludeRejected, appliedByUserId: req.userId, errorMessage: null,
    }, { transaction: t })
    await audit(t, {
      actorUserId: req.userId, action: 'priceVersion.schedule', entity: 'price_version', entityId: reserved.id,
      changes: { priceFileId: priceFile.id, version: reserved.version, effectiveAt: req.effectiveAt!.toISOString(), ...countsFor(priceFile) },
    })
    return { status: 'scheduled' as const, priceFileId: priceFile.id, priceVersionId: reserved.id, version: reserved.version, effectiveAt: req.effectiveAt!.toISOString() }
  })
  armTimer(req.effectiveAt!)
  return outcome
}

async function applyNow(req: ApplyRequest): Promise<ApplyOutcome> {
  try {
    const outcome = await withWrite(async (t) => {
      // locked until this apply commits or rolls back: how other processes tell a running apply from one cut short
      const priceFile = (await PriceFile.findByPk(req.priceFileId, { transaction: t, ...(isPostgres() ? { lock: t.LOCK.UPDATE } : {}) }))!
      priceFile.status = 'ready' // claimed above; the guard checks the rest again inside this transaction
      await guardApply(priceFile, req, t)
      const reserved = await reserveVersion(t, priceFile, req.userId, null)
      const previous = await buildVersion(t, priceFile, reserved, { missingParts: req.missingParts, failMidway: req.failMidway })
      const now = new Date()
      await priceFile.update({
        status: 'applied', priceVersionId: reserved.id, previousPriceVersionId: previous, missingAction: req.missingParts,
        excludeRejected: req.excludeRejected, appliedByUserId: req.userId, appliedAt: now, effectiveAt: now, errorMessage: null,
      }, { transaction: t })
      await audit(t, {
        actorUserId: req.userId, action: 'priceVersion.apply', entity: 'price_version', entityId: reserved.id,
        changes: { priceFileId: priceFile.id, version: reserved.version, previousPriceVersionId: previous, missingParts: req.missingParts, ...countsFor(priceFile) },
      })
      return { status: 'applied' as const, priceFileId: priceFile.id, priceVersionId: reserved.id, version: reserved.version, effectiveAt: null }
    }, { referencesProvedByCaller: true }) // buildVersion proves what it writes (versions.ts, proveReferences)
    // the stored file goes and the admins' summary is sent after the answer: neither can undo the apply
    afterApply(req.priceFileId).catch((e) => console.error('[boreline] after-apply work failed:', e))
    refreshSnapshot()
    return outcome
  } catch (err) {
    const message = isDomainError(err)
      ? err.message
      : 'Applying stopped because of an error and was undone: the prices in use are unchanged.'
    await withWrite((t) => PriceFile.update({ status: 'ready', errorMessage: message }, { where: { id: req.priceFileId, status: 'applying' }, transaction: t }))
    if (isDomainError(err)) throw err
    console.error('[boreline] price file apply failed and was rolled back:', (err as Error).message)
    throw new DomainError('failed', message)
  }
}

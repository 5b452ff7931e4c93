/**
 * Applying a checked price file and rolling it back, each in ONE write transaction (all rows or none).
 *
 * A new version is a complete copy: every part the file prices gets the file's values, every other part the
 * values of the version the check compared against (so rolling back = making the previous version active
 * again, exactly). Parts, stock and version status change in the same transaction; if anything throws, the
 * previous version stays active and untouched. Bulk work is a handful of INSERT … SELECT statements over
 * the staged rows, not one ORM call per row, so even 200,000 rows hold the write lock briefly.
 *
 * Apply, schedule and rollback also refuse to mix files: a file checked against a version that is no longer
 * active must be checked again, and while a version is scheduled no other file is applied.
 */
import { unlink } from 'node:fs/promises'
import { createError } from 'h3'
import { QueryTypes, type Transaction } from 'sequelize'
import { getDb, withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { sendMail, appLink } from '../../utils/mail'
import { User } from '../../models/accounts'
import { PriceList } from '../../models/catalogue'
import { PriceUpload } from '../../models/price-lists'
import type { MissingAction } from '../../../shared/types/price-lists'
import { activePriceListId, storedPath } from './check'

/** SQLite text for a date in the form Sequelize writes (so models read raw-SQL rows back alike). */
export function sqlDate(d: Date): string {
  return `${d.toISOString().replace('T', ' ').replace('Z', '')} +00:00`
}

export interface ApplyRequest {
  uploadId: number
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
  uploadId: number
  priceListId: number
  version: number
  effectiveAt: string | null
}

const refuse = (statusCode: 409 | 422, message: string, fields?: Record<string, string>) =>
  createError({ statusCode, statusMessage: statusCode === 409 ? 'Conflict' : 'Unprocessable Entity', message, data: fields ? { fields } : undefined })

function statusRefusal(up: PriceUpload, version: number | null): Error | null {
  switch (up.status) {
    case 'ready': return null
    case 'uploaded': return refuse(409, 'Choose the columns first: this file has not been checked yet.')
    case 'parsing': return refuse(409, 'This file is still being checked. Wait for the check to finish.')
    case 'failed': return refuse(409, 'This file could not be read, so it cannot be applied. Upload a corrected file.')
    case 'applying': return refuse(409, 'This file is being applied right now.')
    case 'applied': return refuse(409, `This file has already been applied${version ? ` as version ${version}` : ''}.`)
    case 'scheduled': return refuse(409, `This file is already scheduled${version ? ` as version ${version}` : ''}.`)
    case 'rolled_back': return refuse(409, 'This file was applied and then rolled back. Upload it again to apply it again.')
    default: return refuse(409, 'This file cannot be applied now.')
  }
}

async function versionOf(id: number | null, t?: Transaction): Promise<number | null> {
  if (!id) return null
  return (await PriceList.findByPk(id, { transaction: t }))?.version ?? null
}

/** Everything that must hold for an apply; checked again inside the transaction that applies. */
async function guardApply(up: PriceUpload, req: ApplyRequest, t?: Transaction): Promise<void> {
  const s = statusRefusal(up, await versionOf(up.priceListId, t))
  if (s) throw s
  const fields: Record<string, string> = {}
  if (up.countRejected > 0 && !req.excludeRejected) {
    fields.excludeRejected = `${up.countRejected} ${up.countRejected === 1 ? 'row was' : 'rows were'} refused. Fix the file and upload it again, or tick “apply without the refused rows”.`
  }
  if (up.countLarge > 0 && !req.confirmLargeChanges) {
    fields.confirmLargeChanges = `${up.countLarge} ${up.countLarge === 1 ? 'price moves' : 'prices move'} by more than 30 %. Look at them and confirm them before applying.`
  }
  if (req.effectiveAt && req.effectiveAt.getTime() < Date.now() - 5 * 60_000) {
    fields.effectiveAt = 'That time is in the past. Leave it empty to apply now, or choose a later time.'
  }
  if (req.effectiveAt && req.effectiveAt.getTime() > Date.now() + 366 * 24 * 3600_000) {
    fields.effectiveAt = 'Choose a time within the next twelve months.'
  }
  if (Object.keys(fields).length) {
    throw refuse(422, Object.values(fields).join(' '), fields)
  }
  if (up.countNew + up.countChanged + up.countUnchanged === 0) {
    throw refuse(422, 'No row of this file can be applied: every row was refused.', { excludeRejected: 'No row of this file can be applied: every row was refused.' })
  }
  const active = await activeIdIn(t)
  if (active !== (up.basePriceListId ?? null)) {
    throw refuse(409, `The price list in use changed after this file was checked (version ${await versionOf(active, t) ?? 'none'} is in use now). Check the file again before applying it.`)
  }
  const other = await PriceUpload.findOne({ where: { status: 'scheduled' }, transaction: t })
  if (other && other.id !== up.id) {
    const v = await versionOf(other.priceListId, t)
    throw refuse(409, `Version ${v ?? '?'} is scheduled for ${other.effectiveAt?.toISOString() ?? 'later'}. Cancel that schedule before applying another price file.`)
  }
}

async function activeIdIn(t?: Transaction): Promise<number | null> {
  if (!t) return activePriceListId()
  const [row] = await getDb().query<{ id: number }>(`SELECT id FROM price_lists WHERE status = 'active' ORDER BY id DESC LIMIT 1`, { type: QueryTypes.SELECT, transaction: t })
  return row?.id ?? null
}

async function reserveVersion(t: Transaction, up: PriceUpload, userId: number, effectiveAt: Date | null): Promise<PriceList> {
  const [{ next }] = await getDb().query<{ next: number }>('SELECT COALESCE(MAX(version), 0) + 1 AS next FROM price_lists', { type: QueryTypes.SELECT, transaction: t }) as [{ next: number }]
  const when = (effectiveAt ?? new Date()).toISOString().slice(0, 10)
  return PriceList.create({
    version: next,
    label: `${up.supplierName || up.fileName} · ${when}`.slice(0, 160),
    status: 'scheduled',
    effectiveAt,
    activatedAt: null,
    createdByUserId: userId,
  }, { transaction: t })
}

/**
 * Writes the version's rows and makes it active, inside the caller's transaction. `list` is a reserved
 * row (status scheduled). Returns the id that was active before.
 */
async function buildVersion(t: Transaction, up: PriceUpload, list: PriceList, opts: { missingParts: MissingAction; failMidway?: boolean }): Promise<number | null> {
  const q = (sql: string, bind: unknown[]) => getDb().query(sql, { bind, transaction: t })
  const now = sqlDate(new Date())
  const u = up.id
  const base = up.basePriceListId ?? -1

  // a part added by hand since the check would collide with a "new" row: refuse rather than guess
  const [clash] = await getDb().query<{ sku: string }>(
    `SELECT r.sku FROM price_upload_rows r JOIN parts p ON p.sku = r.sku WHERE r.upload_id = $1 AND r.kind = 'new' LIMIT 1`,
    { bind: [u], type: QueryTypes.SELECT, transaction: t },
  )
  if (clash) throw refuse(409, `A part with SKU ${clash.sku} was added to the catalogue after this file was checked. Check the file again before applying it.`)

  await q(`INSERT INTO parts (sku, type, product_line, description, specs, status, created_at, updated_at)
           SELECT sku, part_type, '', description, '{}', 'active', $2, $2 FROM price_upload_rows WHERE upload_id = $1 AND kind = 'new'`, [u, now])
  await q(`UPDATE price_upload_rows SET part_id = (SELECT p.id FROM parts p WHERE p.sku = price_upload_rows.sku), part_status_change = 'created'
            WHERE upload_id = $1 AND kind = 'new'`, [u])
  // the file's rows
  await q(`INSERT INTO prices (price_list_id, part_id, list_price_minor, trade_cost_minor, core_deposit_minor, pack_quantity)
           SELECT $2, part_id, new_list_minor, new_trade_minor, new_core_minor, new_pack
             FROM price_upload_rows WHERE upload_id = $1 AND kind IN ('new', 'changed', 'unchanged')`, [u, list.id])
  // every other part keeps exactly what the compared version gave it (missing, refused, discontinued parts)
  await q(`INSERT INTO prices (price_list_id, part_id, list_price_minor, trade_cost_minor, core_deposit_minor, pack_quantity)
           SELECT $2, pr.part_id, pr.list_price_minor, pr.trade_cost_minor, pr.core_deposit_minor, pr.pack_quantity
             FROM prices pr
            WHERE pr.price_list_id = $3
              AND NOT EXISTS (SELECT 1 FROM price_upload_rows r
                               WHERE r.upload_id = $1 AND r.part_id = pr.part_id AND r.kind IN ('new', 'changed', 'unchanged'))`, [u, list.id, base])
  if (opts.missingParts === 'discontinue') {
    await q(`UPDATE price_upload_rows SET part_status_change = 'discontinued'
              WHERE upload_id = $1 AND kind = 'missing' AND part_id IN (SELECT id FROM parts WHERE status = 'active')`, [u])
    await q(`UPDATE parts SET status = 'discontinued', updated_at = $2
              WHERE id IN (SELECT part_id FROM price_upload_rows WHERE upload_id = $1 AND part_status_change = 'discontinued')`, [u, now])
  }
  // discontinued parts that the file prices again are back in use
  await q(`UPDATE price_upload_rows SET part_status_change = 'reactivated'
            WHERE upload_id = $1 AND kind IN ('changed', 'unchanged') AND part_id IN (SELECT id FROM parts WHERE status = 'discontinued')`, [u])
  await q(`UPDATE parts SET status = 'active', updated_at = $2
            WHERE id IN (SELECT part_id FROM price_upload_rows WHERE upload_id = $1 AND part_status_change = 'reactivated')`, [u, now])
  // stock per branch, for the rows that give it (counts that did not move are not rewritten)
  await q(`INSERT INTO stock_levels (part_id, branch_id, quantity, updated_at)
           SELECT r.part_id, b.id, CAST(j.value AS INTEGER), $2
             FROM price_upload_rows r, json_each(r.stock) j JOIN branches b ON b.code = j.key
            WHERE r.upload_id = $1 AND r.kind IN ('new', 'changed', 'unchanged') AND r.stock IS NOT NULL
           ON CONFLICT (part_id, branch_id) DO UPDATE SET quantity = excluded.quantity, updated_at = excluded.updated_at
             WHERE stock_levels.quantity <> excluded.quantity`, [u, now])

  if (opts.failMidway) throw new Error('test hook: apply stopped midway')

  const previous = await activeIdIn(t)
  await q(`UPDATE price_lists SET status = 'retired', updated_at = $1 WHERE status = 'active'`, [now])
  await q(`UPDATE price_lists SET status = 'active', activated_at = $2, updated_at = $2 WHERE id = $1`, [list.id, now])
  return previous
}

/** Apply now, or schedule when `effectiveAt` is more than a few seconds ahead. */
export async function applyUpload(req: ApplyRequest): Promise<ApplyOutcome> {
  const scheduled = !!req.effectiveAt && req.effectiveAt.getTime() > Date.now() + 5_000
  // 1) claim the upload (a second click, or a second person, is refused while this one runs)
  await withWrite(async (t) => {
    const up = await PriceUpload.findByPk(req.uploadId, { transaction: t })
    if (!up) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Price file not found.' })
    await guardApply(up, req, t)
    if (!scheduled) await up.update({ status: 'applying', errorMessage: null }, { transaction: t })
  })

  if (scheduled) {
    const outcome = await withWrite(async (t) => {
      const up = (await PriceUpload.findByPk(req.uploadId, { transaction: t }))!
      await guardApply(up, req, t)
      const list = await reserveVersion(t, up, req.userId, req.effectiveAt)
      await up.update({
        status: 'scheduled', priceListId: list.id, effectiveAt: req.effectiveAt, missingAction: req.missingParts,
        excludeRejected: req.excludeRejected, appliedByUserId: req.userId, errorMessage: null,
      }, { transaction: t })
      await audit(t, {
        actorUserId: req.userId, action: 'priceList.schedule', entity: 'price_list', entityId: list.id,
        changes: { uploadId: up.id, version: list.version, effectiveAt: req.effectiveAt!.toISOString(), ...countsFor(up) },
      })
      return { status: 'scheduled' as const, uploadId: up.id, priceListId: list.id, version: list.version, effectiveAt: req.effectiveAt!.toISOString() }
    })
    armTimer(req.effectiveAt!)
    return outcome
  }

  try {
    const outcome = await withWrite(async (t) => {
      const up = (await PriceUpload.findByPk(req.uploadId, { transaction: t }))!
      up.status = 'ready' // claimed above; the guard checks the rest again inside this transaction
      await guardApply(up, req, t)
      const list = await reserveVersion(t, up, req.userId, null)
      const previous = await buildVersion(t, up, list, { missingParts: req.missingParts, failMidway: req.failMidway })
      const now = new Date()
      await up.update({
        status: 'applied', priceListId: list.id, previousPriceListId: previous, missingAction: req.missingParts,
        excludeRejected: req.excludeRejected, appliedByUserId: req.userId, appliedAt: now, effectiveAt: now, errorMessage: null,
      }, { transaction: t })
      await audit(t, {
        actorUserId: req.userId, action: 'priceList.apply', entity: 'price_list', entityId: list.id,
        changes: { uploadId: up.id, version: list.version, previousPriceListId: previous, missingParts: req.missingParts, ...countsFor(up) },
      })
      return { status: 'applied' as const, uploadId: up.id, priceListId: list.id, version: list.version, effectiveAt: null }
    })
    await afterApply(req.uploadId)
    return outcome
  } catch (err) {
    const message = (err as { statusCode?: number }).statusCode
      ? (err as Error).message
      : 'Applying stopped because of an error and was undone: the price list in use is unchanged.'
    await withWrite((t) => PriceUpload.update({ status: 'ready', errorMessage: message }, { where: { id: req.uploadId, status: 'applying' }, transaction: t }))
    if ((err as { statusCode?: number }).statusCode) throw err
    console.error('[boreline] price list apply failed and was rolled back:', (err as Error).message)
    throw createError({ statusCode: 500, statusMessage: 'Internal Server Error', message })
  }
}

function countsFor(up: PriceUpload) {
  return { new: up.countNew, changed: up.countChanged, unchanged: up.countUnchanged, missing: up.countMissing, rejected: up.countRejected, large: up.countLarge }
}

async function afterApply(uploadId: number): Promise<void> {
  const up = await PriceUpload.findByPk(uploadId)
  if (!up) return
  if (up.storedName) {
    await unlink(storedPath(up.storedName)).catch(() => {})
    await withWrite((t) => up.update({ storedName: null }, { transaction: t }))
  }
  const list = up.priceListId ? await PriceList.findByPk(up.priceListId) : null
  const prev = await versionOf(up.previousPriceListId)
  const by = up.appliedByUserId ? (await User.findByPk(up.appliedByUserId))?.name ?? 'someone' : 'the scheduler'
  const lines = [
    `Price list version ${list?.version} is now in use (${up.supplierName || up.fileName}), applied by ${by}${prev ? `; version ${prev} was in use before` : ''}.`,
    '',
    `New parts: ${up.countNew}`,
    `Price changes: ${up.countChanged} (${up.countLarge} beyond 30 %)`,
    `Unchanged: ${up.countUnchanged}`,
    `Not in the file: ${up.countMissing} (${up.missingAction === 'discontinue' ? 'marked discontinued' : 'kept'})`,
    `Refused rows left out: ${up.countRejected}`,
    '',
    `Details and roll back: ${appLink(`/price-lists/${up.id}`)}`,
  ]
  await mailAdmins(`Price list version ${list?.version} applied: ${up.countChanged} price changes, ${up.countNew} new parts`, lines.join('\n'))
}

async function mailAdmins(subject: string, text: string): Promise<void> {
  const admins = await User.findAll({ where: { role: 'distributor_admin', status: 'active' } })
  if (!admins.length) return
  await sendMail({ to: admins.map((a) => a.email), subject, text })
}

/** Makes the version that was active before this upload active again; undoes the part statuses it changed. */
export async function rollbackUpload(uploadId: number, userId: number, opts: { failMidway?: boolean } = {}): Promise<{ status: 'rolled_back'; version: number; activeVersion: number }> {
  const result = await withWrite(async (t) => {
    const up = await PriceUpload.findByPk(uploadId, { transaction: t })
    if (!up) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Price file not found.' })
    if (up.status === 'scheduled') throw refuse(409, 'This file is scheduled, not applied: cancel the schedule instead.')
    if (up.status !== 'applied' || !up.priceListId) throw refuse(409, 'Only an applied price file can be rolled back.')
    const list = await PriceList.findByPk(up.priceListId, { transaction: t })
    if (!list || list.status !== 'active') {
      const active = await versionOf(await activeIdIn(t), t)
      throw refuse(409, `Version ${list?.version ?? '?'} is not the one in use (version ${active ?? 'none'} is). Only the version in use can be rolled back.`)
    }
    const prev = up.previousPriceListId ? await PriceList.findByPk(up.previousPriceListId, { transaction: t }) : null
    if (!prev) throw refuse(409, 'This was the first price list: there is no earlier version to return to.')
    const now = sqlDate(new Date())
    const q = (sql: string, bind: unknown[]) => getDb().query(sql, { bind, transaction: t })
    await q(`UPDATE price_lists SET status = 'retired', updated_at = $2 WHERE id = $1`, [list.id, now])
    if (opts.failMidway) throw new Error('test hook: rollback stopped midway')
    await q(`UPDATE price_lists SET status = 'active', activated_at = $2, updated_at = $2 WHERE id = $1`, [prev.id, now])
    await q(`UPDATE parts SET status = 'active', updated_at = $2
              WHERE id IN (SELECT part_id FROM price_upload_rows WHERE upload_id = $1 AND part_status_change = 'discontinued')`, [up.id, now])
    // parts this file created or brought back have no price in the earlier version: out of use again
    await q(`UPDATE parts SET status = 'discontinued', updated_at = $2
              WHERE id IN (SELECT part_id FROM price_upload_rows WHERE upload_id = $1 AND part_status_change IN ('created', 'reactivated'))`, [up.id, now])
    await up.update({ status: 'rolled_back', rolledBackAt: new Date(), rolledBackByUserId: userId }, { transaction: t })
    await audit(t, {
      actorUserId: userId, action: 'priceList.rollback', entity: 'price_list', entityId: list.id,
      changes: { uploadId: up.id, version: list.version, activeAgain: prev.version },
    })
    return { status: 'rolled_back' as const, version: list.version, activeVersion: prev.version, up }
  })
  const by = (await User.findByPk(userId))?.name ?? 'someone'
  await mailAdmins(
    `Price list version ${result.version} rolled back: version ${result.activeVersion} is in use again`,
    [`${by} rolled back price list version ${result.version} (${result.up.supplierName || result.up.fileName}).`,
      `Version ${result.activeVersion} is in use again, with exactly the prices it had.`,
      'Stock counts taken from the file are not undone.', '', `Details: ${appLink(`/price-lists/${result.up.id}`)}`].join('\n'),
  )
  return { status: result.status, version: result.version, activeVersion: result.activeVersion }
}

/** Cancels a scheduled apply: the reserved version disappears and the file can be applied again. */
export async function cancelSchedule(uploadId: number, userId: number): Promise<void> {
  await withWrite(async (t) => {
    const up = await PriceUpload.findByPk(uploadId, { transaction: t })
    if (!up) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Price file not found.' })
    if (up.status !== 'scheduled') throw refuse(409, 'This price file is not scheduled.')
    const version = await versionOf(up.priceListId, t)
    const reserved = up.priceListId
    await up.update({ status: 'ready', priceListId: null, effectiveAt: null, appliedByUserId: null }, { transaction: t })
    // the upload no longer points at the reserved version, so it can go (it has no rows)
    if (reserved) await getDb().query(`DELETE FROM price_lists WHERE id = $1 AND status = 'scheduled'`, { bind: [reserved], transaction: t })
    await audit(t, { actorUserId: userId, action: 'priceList.unschedule', entity: 'price_upload', entityId: up.id, changes: { version } })
  })
}

/** Activates scheduled versions whose time has come. Called by a timer and at start. */
export async function activateDue(now = new Date()): Promise<number> {
  const due = await PriceUpload.findAll({ where: { status: 'scheduled' }, order: [['effectiveAt', 'ASC']] })
  let done = 0
  for (const up of due) {
    if (!up.effectiveAt || up.effectiveAt.getTime() > now.getTime()) continue
    let applied = false
    try {
      await withWrite(async (t) => {
        const fresh = await PriceUpload.findByPk(up.id, { transaction: t })
        if (!fresh || fresh.status !== 'scheduled' || !fresh.priceListId) return
        const list = await PriceList.findByPk(fresh.priceListId, { transaction: t })
        const active = await activeIdIn(t)
        if (!list || active !== (fresh.basePriceListId ?? null)) {
          await fresh.update({
            status: 'ready', priceListId: null,
            errorMessage: 'Not applied at the scheduled time: the price list in use had changed since the check. Check the file again and apply it.',
          }, { transaction: t })
          if (list) await getDb().query(`DELETE FROM price_lists WHERE id = $1 AND status = 'scheduled'`, { bind: [list.id], transaction: t })
          return
        }
        const previous = await buildVersion(t, fresh, list, { missingParts: fresh.missingAction })
        await fresh.update({ status: 'applied', previousPriceListId: previous, appliedAt: new Date() }, { transaction: t })
        await audit(t, {
          actorUserId: fresh.appliedByUserId ?? null, action: 'priceList.apply', entity: 'price_list', entityId: list.id,
          changes: { uploadId: fresh.id, version: list.version, previousPriceListId: previous, scheduledFor: fresh.effectiveAt?.toISOString(), ...countsFor(fresh) },
        })
        applied = true
      })
    } catch (err) {
      console.error('[boreline] scheduled price list could not be applied:', (err as Error).message)
      await withWrite((t) => PriceUpload.update(
        { errorMessage: `The scheduled apply failed and was undone: ${(err as Error).message}` },
        { where: { id: up.id }, transaction: t },
      )).catch(() => {})
    }
    if (applied) {
      done++
      await afterApply(up.id).catch((e) => console.error('[boreline] after-apply work failed:', e))
    }
  }
  return done
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

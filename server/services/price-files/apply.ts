/**
 * Applying a checked price file and rolling it back, each in ONE write transaction (all rows or none).
 *
 * The prices in use live in `part_prices`, one row per part. A new version is the file's findings over the
 * version before it: the apply writes the file's values for the parts that are new or whose prices move (the
 * check's `prices` list, which also holds the values they replace) and records the part statuses it changes.
 * An apply is refused unless the version the check compared with is still in use, and only price files change
 * prices, so rolling back can write those replaced values back and undo the statuses: the previous version's
 * prices return exactly. Parts, prices, stock and version status change in the same transaction; if anything
 * throws, the previous version stays active and untouched. Bulk work is a handful of set-based statements reading
 * the findings inside SQLite (`json_each`), so even 200,000 rows hold the write lock briefly.
 *
 * Apply, schedule and rollback also refuse to mix files: a file checked against a version that is no longer
 * active must be checked again, and while a version is scheduled no other file is applied.
 */
import { unlink } from 'node:fs/promises'
import { QueryTypes, type Transaction } from 'sequelize'
import { getDb, withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { sendMail, appLink } from '../../utils/mail'
import { User } from '../../models/accounts'
import { PriceVersion } from '../../models/catalogue'
import { PriceFile } from '../../models/price-files'
import type { MissingAction } from '../../../shared/types/price-files'
import { activePriceVersionId, storedPath, warmSnapshot } from './check'
import { F, col, deleteFindings, findingsOf } from './findings'
import { DomainError, isDomainError, notFound } from '../errors'

/** SQLite text for a date in the form Sequelize writes (so models read raw-SQL rows back alike). */
export function sqlDate(d: Date): string {
  return `${d.toISOString().replace('T', ' ').replace('Z', '')} +00:00`
}

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

const refuse = (statusCode: 409 | 422, message: string, fields?: Record<string, string>) =>
  new DomainError(statusCode === 409 ? 'conflict' : 'invalid', message, { fields })

function statusRefusal(up: PriceFile, version: number | null): Error | null {
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
  return (await PriceVersion.findByPk(id, { transaction: t }))?.version ?? null
}

/** Everything that must hold for an apply; checked again inside the transaction that applies. */
async function guardApply(up: PriceFile, req: ApplyRequest, t?: Transaction): Promise<void> {
  const s = statusRefusal(up, await versionOf(up.priceVersionId, t))
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
  if (active !== (up.basePriceVersionId ?? null)) {
    throw refuse(409, `The prices in use changed after this file was checked (version ${await versionOf(active, t) ?? 'none'} is in use now). Check the file again before applying it.`)
  }
  const other = await PriceFile.findOne({ where: { status: 'scheduled' }, transaction: t })
  if (other && other.id !== up.id) {
    const v = await versionOf(other.priceVersionId, t)
    throw refuse(409, `Version ${v ?? '?'} is scheduled for ${other.effectiveAt?.toISOString() ?? 'later'}. Cancel that schedule before applying another price file.`)
  }
}

async function activeIdIn(t?: Transaction): Promise<number | null> {
  if (!t) return activePriceVersionId()
  const [row] = await getDb().query<{ id: number }>(`SELECT id FROM price_versions WHERE status = 'active' ORDER BY id DESC LIMIT 1`, { type: QueryTypes.SELECT, transaction: t })
  return row?.id ?? null
}

async function reserveVersion(t: Transaction, up: PriceFile, userId: number, effectiveAt: Date | null): Promise<PriceVersion> {
  const [{ next }] = await getDb().query<{ next: number }>('SELECT COALESCE(MAX(version), 0) + 1 AS next FROM price_versions', { type: QueryTypes.SELECT, transaction: t }) as [{ next: number }]
  const when = (effectiveAt ?? new Date()).toISOString().slice(0, 10)
  return PriceVersion.create({
    version: next,
    label: `${up.supplierName || up.fileName} · ${when}`.slice(0, 160),
    status: 'scheduled',
    effectiveAt,
    activatedAt: null,
    createdByUserId: userId,
  }, { transaction: t })
}

/**
 * Writes the version's prices and makes it active, inside the caller's transaction. `list` is a reserved
 * row (status scheduled). Returns the id that was active before.
 */
async function buildVersion(t: Transaction, up: PriceFile, list: PriceVersion, opts: { missingParts: MissingAction; failMidway?: boolean }): Promise<number | null> {
  const q = (sql: string, bind: unknown[]) => getDb().query(sql, { bind, transaction: t })
  const now = sqlDate(new Date())
  const u = up.id
  await deleteFindings(t, u, APPLY_RECORDS) // left by an earlier apply of this file that was rolled back or failed

  // a part added by hand since the check would collide with a "new" row: refuse rather than guess
  const [clash] = await getDb().query<{ sku: string }>(
    `SELECT p.sku FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')} LIMIT 1`,
    { bind: [u], type: QueryTypes.SELECT, transaction: t },
  )
  if (clash) throw refuse(409, `A part with SKU ${clash.sku} was added to the catalogue after this file was checked. Check the file again before applying it.`)

  await q(`INSERT INTO parts (sku, type, product_line, description, specs, status, created_at, updated_at)
           SELECT ${col('sku')}, ${col('type')}, '', ${col('description')}, '{}', 'active', $2, $2 FROM ${findingsOf(['new'])} f`, [u, now])
  await record(t, u, 'created', `SELECT p.id FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')}`)

  // the file's prices, for the parts whose prices move ('prices': [partId, list, trade, core, pack]) and the new parts
  await q(`INSERT INTO part_prices (part_id, list_price_minor, trade_cost_minor, core_deposit_minor, pack_quantity, price_version_id)
           SELECT f.v->>0, f.v->>1, f.v->>2, COALESCE(f.v->>3, 0), COALESCE(f.v->>4, 1), $2 FROM ${findingsOf(['prices'])} f
           UNION ALL
           SELECT p.id, ${col('newList')}, ${col('newTrade')}, COALESCE(${col('newCore')}, 0), COALESCE(${col('newPack')}, 1), $2
             FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')} WHERE true
           ON CONFLICT (part_id) DO UPDATE SET list_price_minor = excluded.list_price_minor, trade_cost_minor = excluded.trade_cost_minor,
             core_deposit_minor = excluded.core_deposit_minor, pack_quantity = excluded.pack_quantity, price_version_id = excluded.price_version_id`, [u, list.id])

  if (opts.missingParts === 'discontinue') {
    await record(t, u, 'discontinued', `SELECT p.id FROM ${findingsOf(['missing'])} f JOIN parts p ON p.id = ${col('partId')} WHERE p.status = 'active'`)
    await q(`UPDATE parts SET status = 'discontinued', updated_at = $2 WHERE id IN (${recorded('discontinued')})`, [u, now])
  }
  // discontinued parts that the file prices again are back in use
  await record(t, u, 'reactivated', `SELECT p.id FROM ${findingsOf(['revive'])} f JOIN parts p ON p.id = f.v WHERE p.status = 'discontinued'`)
  await q(`UPDATE parts SET status = 'active', updated_at = $2 WHERE id IN (${recorded('reactivated')})`, [u, now])
  // stock per branch: the counts the check found moving ('stock': [partId, { branch: count }]) and the new parts' counts
  await q(`INSERT INTO stock_levels (part_id, branch_id, quantity, updated_at)
           SELECT x.id, b.id, CAST(s.value AS INTEGER), $2
             FROM (SELECT f.v->>0 AS id, f.v->'$[1]' AS stock FROM ${findingsOf(['stock'])} f
                   UNION ALL
                   SELECT p.id AS id, f.v->'$[${F.stock}]' AS stock FROM ${findingsOf(['new'])} f JOIN parts p ON p.sku = ${col('sku')}
                    WHERE ${col('stock')} IS NOT NULL) x, json_each(x.stock) s JOIN branches b ON b.code = s.key
            WHERE true
           ON CONFLICT (part_id, branch_id) DO UPDATE SET quantity = excluded.quantity, updated_at = excluded.updated_at
             WHERE stock_levels.quantity <> excluded.quantity`, [u, now])

  if (opts.failMidway) throw new Error('test hook: apply stopped midway')

  const previous = await activeIdIn(t)
  await q(`UPDATE price_versions SET status = 'retired', updated_at = $1 WHERE status = 'active'`, [now])
  await q(`UPDATE price_versions SET status = 'active', activated_at = $2, updated_at = $2 WHERE id = $1`, [list.id, now])
  return previous
}

/** What an apply records for its roll back. */
const APPLY_RECORDS = ['created', 'discontinued', 'reactivated']

/** Records the part ids `select` returns under `kind` (one chunk). */
async function record(t: Transaction, priceFileId: number, kind: string, select: string): Promise<void> {
  await getDb().query(`INSERT INTO price_file_findings (price_file_id, kind, seq, size, rows)
                       SELECT $1, '${kind}', 0, COUNT(*), COALESCE(json_group_array(x.id), '[]') FROM (${select}) x`, { bind: [priceFileId], transaction: t })
}
/** SQL for the part ids recorded under `kind` for the upload bound as $1. */
function recorded(kind: string): string {
  return `SELECT r.value FROM price_file_findings f, json_each(f.rows) r WHERE f.price_file_id = $1 AND f.kind = '${kind}'`
}

/** Apply now, or schedule when `effectiveAt` is more than a few seconds ahead. */
export async function applyUpload(req: ApplyRequest): Promise<ApplyOutcome> {
  const scheduled = !!req.effectiveAt && req.effectiveAt.getTime() > Date.now() + 5_000
  // 1) claim the upload (a second click, or a second person, is refused while this one runs)
  await withWrite(async (t) => {
    const up = await PriceFile.findByPk(req.priceFileId, { transaction: t })
    if (!up) throw notFound('Price file')
    await guardApply(up, req, t)
    if (!scheduled) await up.update({ status: 'applying', errorMessage: null }, { transaction: t })
  })

  if (scheduled) {
    const outcome = await withWrite(async (t) => {
      const up = (await PriceFile.findByPk(req.priceFileId, { transaction: t }))!
      await guardApply(up, req, t)
      const list = await reserveVersion(t, up, req.userId, req.effectiveAt)
      await up.update({
        status: 'scheduled', priceVersionId: list.id, effectiveAt: req.effectiveAt, missingAction: req.missingParts,
        excludeRejected: req.excludeRejected, appliedByUserId: req.userId, errorMessage: null,
      }, { transaction: t })
      await audit(t, {
        actorUserId: req.userId, action: 'priceVersion.schedule', entity: 'price_version', entityId: list.id,
        changes: { priceFileId: up.id, version: list.version, effectiveAt: req.effectiveAt!.toISOString(), ...countsFor(up) },
      })
      return { status: 'scheduled' as const, priceFileId: up.id, priceVersionId: list.id, version: list.version, effectiveAt: req.effectiveAt!.toISOString() }
    })
    armTimer(req.effectiveAt!)
    return outcome
  }

  try {
    const outcome = await withWrite(async (t) => {
      const up = (await PriceFile.findByPk(req.priceFileId, { transaction: t }))!
      up.status = 'ready' // claimed above; the guard checks the rest again inside this transaction
      await guardApply(up, req, t)
      const list = await reserveVersion(t, up, req.userId, null)
      const previous = await buildVersion(t, up, list, { missingParts: req.missingParts, failMidway: req.failMidway })
      const now = new Date()
      await up.update({
        status: 'applied', priceVersionId: list.id, previousPriceVersionId: previous, missingAction: req.missingParts,
        excludeRejected: req.excludeRejected, appliedByUserId: req.userId, appliedAt: now, effectiveAt: now, errorMessage: null,
      }, { transaction: t })
      await audit(t, {
        actorUserId: req.userId, action: 'priceVersion.apply', entity: 'price_version', entityId: list.id,
        changes: { priceFileId: up.id, version: list.version, previousPriceVersionId: previous, missingParts: req.missingParts, ...countsFor(up) },
      })
      return { status: 'applied' as const, priceFileId: up.id, priceVersionId: list.id, version: list.version, effectiveAt: null }
    })
    // the stored file goes and the admins' summary is sent after the answer: neither can undo the apply
    afterApply(req.priceFileId).catch((e) => console.error('[boreline] after-apply work failed:', e))
    void warmSnapshot()
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

function countsFor(up: PriceFile) {
  return { new: up.countNew, changed: up.countChanged, unchanged: up.countUnchanged, missing: up.countMissing, rejected: up.countRejected, large: up.countLarge }
}

async function afterApply(priceFileId: number): Promise<void> {
  const up = await PriceFile.findByPk(priceFileId)
  if (!up) return
  if (up.storedName) {
    await unlink(storedPath(up.storedName)).catch(() => {})
    await withWrite((t) => up.update({ storedName: null }, { transaction: t }))
  }
  const list = up.priceVersionId ? await PriceVersion.findByPk(up.priceVersionId) : null
  const prev = await versionOf(up.previousPriceVersionId)
  const by = up.appliedByUserId ? (await User.findByPk(up.appliedByUserId))?.name ?? 'someone' : 'the scheduler'
  const lines = [
    `Price version ${list?.version} is now in use (${up.supplierName || up.fileName}), applied by ${by}${prev ? `; version ${prev} was in use before` : ''}.`,
    '',
    `New parts: ${up.countNew}`,
    `Price changes: ${up.countChanged} (${up.countLarge} beyond 30 %)`,
    `Unchanged: ${up.countUnchanged}`,
    `Not in the file: ${up.countMissing} (${up.missingAction === 'discontinue' ? 'marked discontinued' : 'kept'})`,
    `Refused rows left out: ${up.countRejected}`,
    '',
    `Details and roll back: ${appLink(`/price-files/${up.id}`)}`,
  ]
  await mailAdmins(`Price version ${list?.version} applied: ${up.countChanged} price changes, ${up.countNew} new parts`, lines.join('\n'))
}

async function mailAdmins(subject: string, text: string): Promise<void> {
  const admins = await User.findAll({ where: { role: 'distributor_admin', status: 'active' } })
  if (!admins.length) return
  await sendMail({ to: admins.map((a) => a.email), subject, text })
}

/** Makes the version that was active before this upload active again; undoes the part statuses it changed. */
export async function rollbackPriceFile(priceFileId: number, userId: number, opts: { failMidway?: boolean } = {}): Promise<{ status: 'rolled_back'; version: number; activeVersion: number }> {
  const result = await withWrite(async (t) => {
    const up = await PriceFile.findByPk(priceFileId, { transaction: t })
    if (!up) throw notFound('Price file')
    if (up.status === 'scheduled') throw refuse(409, 'This file is scheduled, not applied: cancel the schedule instead.')
    if (up.status !== 'applied' || !up.priceVersionId) throw refuse(409, 'Only an applied price file can be rolled back.')
    const list = await PriceVersion.findByPk(up.priceVersionId, { transaction: t })
    if (!list || list.status !== 'active') {
      const active = await versionOf(await activeIdIn(t), t)
      throw refuse(409, `Version ${list?.version ?? '?'} is not the one in use (version ${active ?? 'none'} is). Only the version in use can be rolled back.`)
    }
    const prev = up.previousPriceVersionId ? await PriceVersion.findByPk(up.previousPriceVersionId, { transaction: t }) : null
    if (!prev) throw refuse(409, 'This was the first price version: there is no earlier version to return to.')
    const now = sqlDate(new Date())
    const q = (sql: string, bind: unknown[]) => getDb().query(sql, { bind, transaction: t })
    await q(`UPDATE price_versions SET status = 'retired', updated_at = $2 WHERE id = $1`, [list.id, now])
    if (opts.failMidway) throw new Error('test hook: rollback stopped midway')
    await q(`UPDATE price_versions SET status = 'active', activated_at = $2, updated_at = $2 WHERE id = $1`, [prev.id, now])
    // the prices this file replaced, exactly as they were ('prices': [part, new list, trade, core, pack, old list,
    // trade, core, pack, old version]); parts it priced for the first time lose that price
    await q(`UPDATE part_prices SET list_price_minor = b.v->>5, trade_cost_minor = b.v->>6, core_deposit_minor = COALESCE(b.v->>7, 0),
                    pack_quantity = COALESCE(b.v->>8, 1), price_version_id = b.v->>9
               FROM ${findingsOf(['prices'])} b WHERE part_prices.part_id = b.v->>0 AND b.v->>5 IS NOT NULL AND b.v->>9 IS NOT NULL`, [up.id])
    await q(`DELETE FROM part_prices WHERE part_id IN (SELECT b.v->>0 FROM ${findingsOf(['prices'])} b WHERE b.v->>5 IS NULL OR b.v->>9 IS NULL)
                OR part_id IN (${recorded('created')})`, [up.id])
    await q(`UPDATE parts SET status = 'active', updated_at = $2 WHERE id IN (${recorded('discontinued')})`, [up.id, now])
    // parts this file created or brought back have no price in the earlier version: out of use again
    await q(`UPDATE parts SET status = 'discontinued', updated_at = $2 WHERE id IN (${recorded('created')}) OR id IN (${recorded('reactivated')})`, [up.id, now])
    await up.update({ status: 'rolled_back', rolledBackAt: new Date(), rolledBackByUserId: userId }, { transaction: t })
    await audit(t, {
      actorUserId: userId, action: 'priceVersion.rollback', entity: 'price_version', entityId: list.id,
      changes: { priceFileId: up.id, version: list.version, activeAgain: prev.version },
    })
    return { status: 'rolled_back' as const, version: list.version, activeVersion: prev.version, up }
  })
  void warmSnapshot()
  const by = (await User.findByPk(userId))?.name ?? 'someone'
  await mailAdmins(
    `Price version ${result.version} rolled back: version ${result.activeVersion} is in use again`,
    [`${by} rolled back price version ${result.version} (${result.up.supplierName || result.up.fileName}).`,
      `Version ${result.activeVersion} is in use again, with exactly the prices it had.`,
      'Stock counts taken from the file are not undone.', '', `Details: ${appLink(`/price-files/${result.up.id}`)}`].join('\n'),
  )
  return { status: result.status, version: result.version, activeVersion: result.activeVersion }
}

/** Cancels a scheduled apply: the reserved version disappears and the file can be applied again. */
export async function cancelSchedule(priceFileId: number, userId: number): Promise<void> {
  await withWrite(async (t) => {
    const up = await PriceFile.findByPk(priceFileId, { transaction: t })
    if (!up) throw notFound('Price file')
    if (up.status !== 'scheduled') throw refuse(409, 'This price file is not scheduled.')
    const version = await versionOf(up.priceVersionId, t)
    const reserved = up.priceVersionId
    await up.update({ status: 'ready', priceVersionId: null, effectiveAt: null, appliedByUserId: null }, { transaction: t })
    // the upload no longer points at the reserved version, so it can go (it has no rows)
    if (reserved) await getDb().query(`DELETE FROM price_versions WHERE id = $1 AND status = 'scheduled'`, { bind: [reserved], transaction: t })
    await audit(t, { actorUserId: userId, action: 'priceVersion.unschedule', entity: 'price_file', entityId: up.id, changes: { version } })
  })
}

/** Activates scheduled versions whose time has come. Called by a timer and at start. */
export async function activateDue(now = new Date()): Promise<number> {
  const due = await PriceFile.findAll({ where: { status: 'scheduled' }, order: [['effectiveAt', 'ASC']] })
  let done = 0
  for (const up of due) {
    if (!up.effectiveAt || up.effectiveAt.getTime() > now.getTime()) continue
    let applied = false
    try {
      await withWrite(async (t) => {
        const fresh = await PriceFile.findByPk(up.id, { transaction: t })
        if (!fresh || fresh.status !== 'scheduled' || !fresh.priceVersionId) return
        const list = await PriceVersion.findByPk(fresh.priceVersionId, { transaction: t })
        const active = await activeIdIn(t)
        if (!list || active !== (fresh.basePriceVersionId ?? null)) {
          await fresh.update({
            status: 'ready', priceVersionId: null,
            errorMessage: 'Not applied at the scheduled time: the prices in use had changed since the check. Check the file again and apply it.',
          }, { transaction: t })
          if (list) await getDb().query(`DELETE FROM price_versions WHERE id = $1 AND status = 'scheduled'`, { bind: [list.id], transaction: t })
          return
        }
        const previous = await buildVersion(t, fresh, list, { missingParts: fresh.missingAction })
        await fresh.update({ status: 'applied', previousPriceVersionId: previous, appliedAt: new Date() }, { transaction: t })
        await audit(t, {
          actorUserId: fresh.appliedByUserId ?? null, action: 'priceVersion.apply', entity: 'price_version', entityId: list.id,
          changes: { priceFileId: fresh.id, version: list.version, previousPriceVersionId: previous, scheduledFor: fresh.effectiveAt?.toISOString(), ...countsFor(fresh) },
        })
        applied = true
      })
    } catch (err) {
      console.error('[boreline] scheduled price version could not be applied:', (err as Error).message)
      await withWrite((t) => PriceFile.update(
        { errorMessage: `The scheduled apply failed and was undone: ${(err as Error).message}` },
        { where: { id: up.id }, transaction: t },
      )).catch(() => {})
    }
    if (applied) {
      done++
      void warmSnapshot()
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

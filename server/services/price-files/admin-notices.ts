/**
 * What follows an apply or a roll back, after the answer: the stored file is no longer needed once applied, and the
 * distributor's admins get a summary by e-mail. Neither can undo what was done, so their failures are only logged.
 */
import { unlink } from 'node:fs/promises'
import { withWrite } from '../../utils/db'
import { sendMail, appLink } from '../../utils/mail'
import { serverFormats } from '../../utils/format'
import { User } from '../../models/accounts'
import { PriceVersion } from '../../models/catalogue'
import { PriceFile } from '../../models/price-files'
import { versionNumberOf } from './versions'
import { storedPath } from './storage'

async function mailAdmins(subject: string, text: string): Promise<void> {
  const admins = await User.findAll({ where: { role: 'distributor_admin', status: 'active' } })
  if (!admins.length) return
  await sendMail({ to: admins.map((a) => a.email), subject, text })
}

/** Removes the stored file of an applied price file and sends the admins the summary of the new version. */
export async function afterApply(priceFileId: number): Promise<void> {
  const priceFile = await PriceFile.findByPk(priceFileId)
  if (!priceFile) return
  if (priceFile.storedName) {
    await unlink(storedPath(priceFile.storedName)).catch(() => {})
    await withWrite((t) => priceFile.update({ storedName: null }, { transaction: t }))
  }
  const made = priceFile.priceVersionId ? await PriceVersion.findByPk(priceFile.priceVersionId) : null
  const prev = await versionNumberOf(priceFile.previousPriceVersionId)
  const by = priceFile.appliedByUserId ? (await User.findByPk(priceFile.appliedByUserId))?.name ?? 'someone' : 'the scheduler'
  const lines = [
    `Price version ${made?.version} is now in use (${priceFile.supplierName || priceFile.fileName}), applied by ${by}${prev ? `; version ${prev} was in use before` : ''}.`,
    '',
    `New parts: ${priceFile.countNew}`,
    `Price changes: ${priceFile.countChanged} (${priceFile.countLarge} beyond 30 %)`,
    `Unchanged: ${priceFile.countUnchanged}`,
    `Not in the file: ${priceFile.countMissing} (${priceFile.missingAction === 'discontinue' ? 'marked discontinued' : 'kept'})`,
    `Refused rows left out: ${priceFile.countRejected}`,
    '',
    `Details and roll back: ${appLink(`/price-files/${priceFile.id}`)}`,
  ]
  const { counted } = serverFormats()
  await mailAdmins(`Price version ${made?.version} applied: ${counted(priceFile.countChanged, 'price change', 'price changes')}, ${counted(priceFile.countNew, 'new part', 'new parts')}`, lines.join('\n'))
}

/** Tells the admins that a version was rolled back and which one is in use again. */
export async function noticeRollback(rolledBack: { priceFile: PriceFile; version: number; activeVersion: number; userId: number }): Promise<void> {
  const { priceFile, version, activeVersion } = rolledBack
  const by = (await User.findByPk(rolledBack.userId))?.name ?? 'someone'
  await mailAdmins(
    `Price version ${version} rolled back: version ${activeVersion} is in use again`,
    [`${by} rolled back price version ${version} (${priceFile.supplierName || priceFile.fileName}).`,
      `Version ${activeVersion} is in use again, with exactly the prices it had.`,
      'Stock counts taken from the file are not undone.', '', `Details: ${appLink(`/price-files/${priceFile.id}`)}`].join('\n'),
  )
}

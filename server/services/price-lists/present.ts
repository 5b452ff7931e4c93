/** What the price-list routes return, built from the models (no HTTP here). */
import { Op } from 'sequelize'
import { Branch, User } from '../../models/accounts'
import { PriceList } from '../../models/catalogue'
import { PriceUpload, type PriceUploadRow } from '../../models/price-lists'
import type { PriceChangeRow, PriceUploadDetail, PriceUploadSummary, PriceVersionSummary, UploadCounts } from '../../../shared/types/price-lists'
import { checkMapping } from './mapping'
import { activePriceListId, liveProgress } from './check'

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null)

export function countsOf(up: PriceUpload): UploadCounts {
  return {
    rows: up.rowsTotal, new: up.countNew, changed: up.countChanged, unchanged: up.countUnchanged,
    missing: up.countMissing, rejected: up.countRejected, large: up.countLarge,
  }
}

async function namesOf(ids: (number | null | undefined)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => !!x))]
  if (!wanted.length) return new Map()
  const users = await User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name'] })
  return new Map(users.map((u) => [u.id, u.name]))
}

async function versionsOf(ids: (number | null | undefined)[]): Promise<Map<number, number>> {
  const wanted = [...new Set(ids.filter((x): x is number => !!x))]
  if (!wanted.length) return new Map()
  const lists = await PriceList.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'version'] })
  return new Map(lists.map((l) => [l.id, l.version]))
}

function summary(up: PriceUpload, names: Map<number, string>, versions: Map<number, number>): PriceUploadSummary {
  const l = liveProgress(up.id)
  return {
    id: up.id,
    status: up.status,
    fileName: up.fileName,
    fileFormat: up.fileFormat,
    supplierName: up.supplierName,
    progress: up.status === 'parsing' ? (l?.progress ?? 0) : up.progress,
    counts: countsOf(up),
    createdAt: iso(up.createdAt)!,
    createdBy: names.get(up.createdByUserId) ?? null,
    version: up.priceListId ? versions.get(up.priceListId) ?? null : null,
    effectiveAt: iso(up.effectiveAt),
  }
}

export async function uploadSummaries(rows: PriceUpload[]): Promise<PriceUploadSummary[]> {
  const names = await namesOf(rows.map((r) => r.createdByUserId))
  const versions = await versionsOf(rows.map((r) => r.priceListId))
  return rows.map((r) => summary(r, names, versions))
}

export async function versionSummaries(limit = 50): Promise<PriceVersionSummary[]> {
  const lists = await PriceList.findAll({ order: [['version', 'DESC']], limit })
  const names = await namesOf(lists.map((l) => l.createdByUserId))
  const uploads = await PriceUpload.findAll({ where: { priceListId: { [Op.in]: lists.map((l) => l.id) } }, attributes: ['id', 'priceListId', 'status'] })
  const uploadOf = new Map(uploads.map((u) => [u.priceListId!, u]))
  return lists.map((l) => ({
    id: l.id, version: l.version, label: l.label, status: l.status,
    effectiveAt: iso(l.effectiveAt), activatedAt: iso(l.activatedAt),
    createdBy: l.createdByUserId ? names.get(l.createdByUserId) ?? null : null,
    uploadId: uploadOf.get(l.id)?.id ?? null,
    rolledBack: uploadOf.get(l.id)?.status === 'rolled_back',
  }))
}

export async function uploadDetail(up: PriceUpload): Promise<PriceUploadDetail> {
  const names = await namesOf([up.createdByUserId, up.appliedByUserId])
  const activeId = await activePriceListId()
  const versions = await versionsOf([up.priceListId, up.basePriceListId, up.previousPriceListId, activeId])
  const branchCodes = (await Branch.findAll({ attributes: ['code'], order: [['code', 'ASC']] })).map((b) => b.code)
  const l = liveProgress(up.id)
  const list = up.priceListId ? await PriceList.findByPk(up.priceListId) : null
  const hasFile = !!up.storedName
  return {
    ...summary(up, names, versions),
    stage: up.status === 'parsing' ? (l?.stage ?? up.stage ?? 'queued') : null,
    fileSize: up.fileSize,
    delimiter: up.delimiter,
    delimiterChosen: up.delimiterChosen,
    decimalMark: up.decimalMark === ',' ? ',' : '.',
    encoding: up.encoding,
    headers: up.headers,
    mapping: up.mapping,
    mappingCheck: up.headers.length ? checkMapping(up.mapping, up.headers, branchCodes) : { problems: {}, notes: [] },
    branchCodes,
    errorMessage: up.errorMessage,
    missingAction: up.missingAction,
    excludeRejected: up.excludeRejected,
    baseVersion: up.basePriceListId ? versions.get(up.basePriceListId) ?? null : null,
    activeVersion: activeId ? versions.get(activeId) ?? null : null,
    priceListId: up.priceListId,
    previousVersion: up.previousPriceListId ? versions.get(up.previousPriceListId) ?? null : null,
    appliedAt: iso(up.appliedAt),
    appliedBy: up.appliedByUserId ? names.get(up.appliedByUserId) ?? null : null,
    rolledBackAt: iso(up.rolledBackAt),
    canApply: up.status === 'ready' && (up.basePriceListId ?? null) === activeId,
    canRollback: up.status === 'applied' && list?.status === 'active' && !!up.previousPriceListId,
    canCancelSchedule: up.status === 'scheduled',
    canRecheck: hasFile && ['uploaded', 'ready', 'failed'].includes(up.status),
  }
}

export function changeRow(r: PriceUploadRow): PriceChangeRow {
  return {
    id: r.id, kind: r.kind, rowNumber: r.rowNumber, sku: r.sku, description: r.description, partType: r.partType,
    oldListMinor: r.oldListMinor, newListMinor: r.newListMinor, oldTradeMinor: r.oldTradeMinor, newTradeMinor: r.newTradeMinor,
    oldCoreMinor: r.oldCoreMinor, newCoreMinor: r.newCoreMinor, oldPack: r.oldPack, newPack: r.newPack,
    changePct: r.changePct, large: !!r.large, stock: r.stock, columns: r.columns, reason: r.reason,
  }
}

/** What the price-file routes return about files and versions, built from the models (no HTTP here). */
import { Op } from 'sequelize'
import { Branch, User } from '../../models/accounts'
import { PriceVersion } from '../../models/catalogue'
import { PriceFile } from '../../models/price-files'
import { pageOf } from '../../utils/page'
import type { PageQuery } from '../../../shared/schemas/page'
import type { PriceFileCounts, PriceFileDetail, PriceFileList, PriceFileSummary, PriceVersionSummary } from '../../../shared/types/price-files'
import { activePriceVersion } from '../price-versions'
import { notFound } from '../errors'
import { checkMapping } from './mapping'
import { liveProgress } from './queue'
import { RECHECKABLE } from './recheck'
import { supplierNames } from './supplier-mappings'

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null)

/** The price file `id`, or 404. */
export async function findPriceFile(id: number): Promise<PriceFile> {
  const priceFile = await PriceFile.findByPk(id)
  if (!priceFile) throw notFound('Price file')
  return priceFile
}

function countsOf(priceFile: PriceFile): PriceFileCounts {
  return {
    rows: priceFile.rowsTotal, new: priceFile.countNew, changed: priceFile.countChanged, unchanged: priceFile.countUnchanged,
    missing: priceFile.countMissing, rejected: priceFile.countRejected, large: priceFile.countLarge,
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
  const versions = await PriceVersion.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'version'] })
  return new Map(versions.map((v) => [v.id, v.version]))
}

function summary(priceFile: PriceFile, names: Map<number, string>, versions: Map<number, number>): PriceFileSummary {
  const live = liveProgress(priceFile.id)
  return {
    id: priceFile.id,
    status: priceFile.status,
    fileName: priceFile.fileName,
    fileFormat: priceFile.fileFormat,
    supplierName: priceFile.supplierName,
    progress: priceFile.status === 'parsing' ? (live?.progress ?? priceFile.progress ?? 0) : priceFile.progress,
    counts: countsOf(priceFile),
    createdAt: iso(priceFile.createdAt)!,
    createdBy: names.get(priceFile.createdByUserId) ?? null,
    version: priceFile.priceVersionId ? versions.get(priceFile.priceVersionId) ?? null : null,
    effectiveAt: iso(priceFile.effectiveAt),
  }
}

async function priceFileSummaries(rows: PriceFile[]): Promise<PriceFileSummary[]> {
  const names = await namesOf(rows.map((r) => r.createdByUserId))
  const versions = await versionsOf(rows.map((r) => r.priceVersionId))
  return rows.map((r) => summary(r, names, versions))
}

/** The latest price versions, newest first, with the file that made each. */
async function versionSummaries(limit = 50): Promise<PriceVersionSummary[]> {
  const versions = await PriceVersion.findAll({ order: [['version', 'DESC']], limit })
  const names = await namesOf(versions.map((v) => v.createdByUserId))
  const files = await PriceFile.findAll({ where: { priceVersionId: { [Op.in]: versions.map((v) => v.id) } }, attributes: ['id', 'priceVersionId', 'status'] })
  const fileOf = new Map(files.map((f) => [f.priceVersionId!, f]))
  return versions.map((v) => ({
    id: v.id, version: v.version, label: v.label, status: v.status,
    effectiveAt: iso(v.effectiveAt), activatedAt: iso(v.activatedAt),
    createdBy: v.createdByUserId ? names.get(v.createdByUserId) ?? null : null,
    priceFileId: fileOf.get(v.id)?.id ?? null,
    rolledBack: fileOf.get(v.id)?.status === 'rolled_back',
  }))
}

/** One page of price files (newest first), with the versions and the suppliers that have a remembered mapping. */
export async function priceFilesPage(query: PageQuery): Promise<PriceFileList> {
  const page = await pageOf(query, (window) => PriceFile.findAndCountAll({ order: [['id', 'DESC']], ...window }), priceFileSummaries)
  const versions = await versionSummaries()
  return {
    ...page,
    versions,
    activeVersion: versions.find((v) => v.status === 'active')?.version ?? null,
    suppliers: await supplierNames(),
  }
}

/** Everything the price file's page shows, with what the person may do next. */
export async function priceFileDetail(priceFile: PriceFile): Promise<PriceFileDetail> {
  const names = await namesOf([priceFile.createdByUserId, priceFile.appliedByUserId])
  const active = await activePriceVersion()
  const activeId = active?.id ?? null
  const versions = await versionsOf([priceFile.priceVersionId, priceFile.basePriceVersionId, priceFile.previousPriceVersionId])
  const branchCodes = (await Branch.findAll({ attributes: ['code'], order: [['code', 'ASC']] })).map((b) => b.code)
  const live = liveProgress(priceFile.id)
  const made = priceFile.priceVersionId ? await PriceVersion.findByPk(priceFile.priceVersionId) : null
  const hasFile = !!priceFile.storedName
  return {
    ...summary(priceFile, names, versions),
    stage: priceFile.status === 'parsing' ? (live?.stage ?? priceFile.stage ?? 'queued') : null,
    fileSize: priceFile.fileSize,
    delimiter: priceFile.delimiter,
    delimiterChosen: priceFile.delimiterChosen,
    decimalMark: priceFile.decimalMark === ',' ? ',' : '.',
    encoding: priceFile.encoding,
    headers: priceFile.headers,
    mapping: priceFile.mapping,
    mappingCheck: priceFile.headers.length ? checkMapping(priceFile.mapping, priceFile.headers, branchCodes) : { problems: {}, notes: [] },
    branchCodes,
    errorMessage: priceFile.errorMessage,
    missingAction: priceFile.missingAction,
    excludeRejected: priceFile.excludeRejected,
    baseVersion: priceFile.basePriceVersionId ? versions.get(priceFile.basePriceVersionId) ?? null : null,
    activeVersion: active?.version ?? null,
    priceVersionId: priceFile.priceVersionId,
    previousVersion: priceFile.previousPriceVersionId ? versions.get(priceFile.previousPriceVersionId) ?? null : null,
    appliedAt: iso(priceFile.appliedAt),
    appliedBy: priceFile.appliedByUserId ? names.get(priceFile.appliedByUserId) ?? null : null,
    rolledBackAt: iso(priceFile.rolledBackAt),
    canApply: priceFile.status === 'ready' && (priceFile.basePriceVersionId ?? null) === activeId,
    canRollback: priceFile.status === 'applied' && made?.status === 'active' && !!priceFile.previousPriceVersionId,
    canCancelSchedule: priceFile.status === 'scheduled',
    canRecheck: hasFile && RECHECKABLE.includes(priceFile.status),
  }
}

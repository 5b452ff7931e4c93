/** What the price-list routes return, built from the models (no HTTP here). */
import { Op } from 'sequelize'
import { Branch, User } from '../../models/accounts'
import { PriceVersion } from '../../models/catalogue'
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import { PriceFile } from '../../models/price-files'
import type { ChangesQuery } from '../../../shared/schemas/price-files'
import type { PriceChangeRow, PriceFileDetail, PriceFileSummary, PriceVersionSummary, UploadCounts } from '../../../shared/types/price-files'
import { checkMapping } from './mapping'
import { activePriceVersionId, liveProgress } from './check'
import { F, readFindings, type PriceCheckFinding } from './findings'

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null)

export function countsOf(up: PriceFile): UploadCounts {
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
  const lists = await PriceVersion.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'version'] })
  return new Map(lists.map((l) => [l.id, l.version]))
}

function summary(up: PriceFile, names: Map<number, string>, versions: Map<number, number>): PriceFileSummary {
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
    version: up.priceVersionId ? versions.get(up.priceVersionId) ?? null : null,
    effectiveAt: iso(up.effectiveAt),
  }
}

export async function uploadSummaries(rows: PriceFile[]): Promise<PriceFileSummary[]> {
  const names = await namesOf(rows.map((r) => r.createdByUserId))
  const versions = await versionsOf(rows.map((r) => r.priceVersionId))
  return rows.map((r) => summary(r, names, versions))
}

export async function versionSummaries(limit = 50): Promise<PriceVersionSummary[]> {
  const lists = await PriceVersion.findAll({ order: [['version', 'DESC']], limit })
  const names = await namesOf(lists.map((l) => l.createdByUserId))
  const uploads = await PriceFile.findAll({ where: { priceVersionId: { [Op.in]: lists.map((l) => l.id) } }, attributes: ['id', 'priceVersionId', 'status'] })
  const uploadOf = new Map(uploads.map((u) => [u.priceVersionId!, u]))
  return lists.map((l) => ({
    id: l.id, version: l.version, label: l.label, status: l.status,
    effectiveAt: iso(l.effectiveAt), activatedAt: iso(l.activatedAt),
    createdBy: l.createdByUserId ? names.get(l.createdByUserId) ?? null : null,
    priceFileId: uploadOf.get(l.id)?.id ?? null,
    rolledBack: uploadOf.get(l.id)?.status === 'rolled_back',
  }))
}

export async function uploadDetail(up: PriceFile): Promise<PriceFileDetail> {
  const names = await namesOf([up.createdByUserId, up.appliedByUserId])
  const activeId = await activePriceVersionId()
  const versions = await versionsOf([up.priceVersionId, up.basePriceVersionId, up.previousPriceVersionId, activeId])
  const branchCodes = (await Branch.findAll({ attributes: ['code'], order: [['code', 'ASC']] })).map((b) => b.code)
  const l = liveProgress(up.id)
  const list = up.priceVersionId ? await PriceVersion.findByPk(up.priceVersionId) : null
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
    baseVersion: up.basePriceVersionId ? versions.get(up.basePriceVersionId) ?? null : null,
    activeVersion: activeId ? versions.get(activeId) ?? null : null,
    priceVersionId: up.priceVersionId,
    previousVersion: up.previousPriceVersionId ? versions.get(up.previousPriceVersionId) ?? null : null,
    appliedAt: iso(up.appliedAt),
    appliedBy: up.appliedByUserId ? names.get(up.appliedByUserId) ?? null : null,
    rolledBackAt: iso(up.rolledBackAt),
    canApply: up.status === 'ready' && (up.basePriceVersionId ?? null) === activeId,
    canRollback: up.status === 'applied' && list?.status === 'active' && !!up.previousPriceVersionId,
    canCancelSchedule: up.status === 'scheduled',
    canRecheck: hasFile && ['uploaded', 'ready', 'failed'].includes(up.status),
  }
}

type Indexed = { f: PriceCheckFinding; i: number }

const SORTS: Record<ChangesQuery['sort'], (a: PriceCheckFinding, b: PriceCheckFinding) => number> = {
  row: (a, b) => nullsLast(a[F.row], b[F.row]) || text(a[F.sku], b[F.sku]),
  sku: (a, b) => text(a[F.sku], b[F.sku]),
  change: (a, b) => nullsLast(a[F.pct], b[F.pct]),
  old: (a, b) => nullsLast(a[F.oldList], b[F.oldList]),
  new: (a, b) => nullsLast(a[F.newList], b[F.newList]),
}
function nullsLast(a: number | null, b: number | null): number {
  if (a === b) return 0
  if (a === null) return Number.POSITIVE_INFINITY
  if (b === null) return Number.NEGATIVE_INFINITY
  return a - b
}
function text(a: string | null, b: string | null): number {
  return (a ?? '') < (b ?? '') ? -1 : (a ?? '') > (b ?? '') ? 1 : 0
}

/** One page of one kind of findings, filtered and sorted as asked (nulls last either way; ties by SKU, then file order). */
export async function changesPage(priceFileId: number, q: ChangesQuery): Promise<{ data: PriceChangeRow[]; meta: { page: number; pageSize: number; total: number; pages: number } }> {
  const all = await readFindings(priceFileId, q.kind)
  let rows: Indexed[] = all.map((f, i) => ({ f, i }))
  if (q.q) {
    const needle = q.q.toLowerCase()
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
    const byDescription = new Set((await getDb().query<{ id: number }>(
      `SELECT id FROM parts WHERE description LIKE $1 ESCAPE '\\'`, { bind: [like], type: QueryTypes.SELECT },
    )).map((r) => r.id))
    rows = rows.filter(({ f }) => (f[F.sku] ?? '').toLowerCase().includes(needle) || (f[F.description] ?? '').toLowerCase().includes(needle)
      || (f[F.partId] != null && byDescription.has(f[F.partId]!)))
  }
  if (q.large) rows = rows.filter(({ f }) => f[F.large] === 1)
  if (q.direction === 'up') rows = rows.filter(({ f }) => f[F.newList] != null && f[F.oldList] != null && f[F.newList]! > f[F.oldList]!)
  if (q.direction === 'down') rows = rows.filter(({ f }) => f[F.newList] != null && f[F.oldList] != null && f[F.newList]! < f[F.oldList]!)
  const by = SORTS[q.sort]
  const sign = q.dir === 'desc' ? -1 : 1
  rows.sort((a, b) => {
    const primary = by(a.f, b.f)
    if (primary !== 0) {
      // nulls stay last whichever way the rest is ordered
      if (!Number.isFinite(primary)) return primary > 0 ? 1 : -1
      return sign * primary
    }
    return text(a.f[F.sku], b.f[F.sku]) || a.i - b.i
  })
  const total = rows.length
  const pageRows = rows.slice((q.page - 1) * q.pageSize, q.page * q.pageSize)
  // descriptions and types of catalogue parts come from the catalogue (the file may leave them blank)
  const ids = [...new Set(pageRows.map(({ f }) => f[F.partId]).filter((x): x is number => x != null))]
  const parts = ids.length
    ? new Map((await getDb().query<{ id: number; description: string; type: string }>(
      'SELECT id, description, type FROM parts WHERE id IN (:ids)', { replacements: { ids }, type: QueryTypes.SELECT },
    )).map((p) => [p.id, p]))
    : new Map<number, { description: string; type: string }>()
  const data: PriceChangeRow[] = pageRows.map(({ f, i }) => {
    const part = f[F.partId] != null ? parts.get(f[F.partId]!) : undefined
    return {
      id: i + 1, kind: q.kind, rowNumber: f[F.row], sku: f[F.sku],
      description: f[F.description] ?? part?.description ?? null, partType: f[F.type] ?? part?.type ?? null,
      oldListMinor: f[F.oldList], newListMinor: f[F.newList], oldTradeMinor: f[F.oldTrade], newTradeMinor: f[F.newTrade],
      oldCoreMinor: f[F.oldCore], newCoreMinor: f[F.newCore], oldPack: f[F.oldPack], newPack: f[F.newPack],
      changePct: f[F.pct], large: f[F.large] === 1, stock: f[F.stock], columns: f[F.columns], reason: f[F.reason],
    }
  })
  return { data, meta: { page: q.page, pageSize: q.pageSize, total, pages: Math.max(1, Math.ceil(total / q.pageSize)) } }
}

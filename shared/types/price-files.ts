/**
 * Price files: the statuses a price file goes through, what the check finds per row, and the shapes the
 * price-file routes return. Shared by the server routes and the pages.
 */
import type { Page } from './page'

export const PRICE_FILE_STATUSES = ['uploaded', 'parsing', 'ready', 'failed', 'applying', 'applied', 'scheduled', 'rolled_back'] as const
export type PriceFileStatus = (typeof PRICE_FILE_STATUSES)[number]

export const CHANGE_KINDS = ['new', 'changed', 'unchanged', 'missing', 'rejected'] as const
export type ChangeKind = (typeof CHANGE_KINDS)[number]

export type MissingAction = 'keep' | 'discontinue'

/** Limits of one price file. */
export const PRICE_FILE_LIMITS = {
  maxBytes: 50 * 1024 * 1024,
  maxRows: 200_000,
  /** cells per row: a price file needs a dozen columns; a cell far to the right (column XFD) is refused unread */
  maxColumns: 100,
  /** XLSX (a zip): more entries or more inflated bytes than this is refused before anything is inflated */
  maxZipEntries: 2_000,
  maxZipInflatedBytes: 800 * 1024 * 1024,
  maxZipRatio: 250,
} as const

/** A list-price change beyond this (either way, in percent) needs an explicit confirmation to apply. */
export const LARGE_CHANGE_PERCENT = 30

/** The part fields a column of the file can feed. `stock` maps branch codes to columns. */
export const MAPPING_FIELDS = ['sku', 'description', 'type', 'listPrice', 'tradeCost', 'coreDeposit', 'packQuantity'] as const
export type MappingField = (typeof MAPPING_FIELDS)[number]

export const MAPPING_LABELS: Record<MappingField, string> = {
  sku: 'SKU',
  description: 'Description',
  type: 'Part type',
  listPrice: 'List price',
  tradeCost: 'Trade cost',
  coreDeposit: 'Core deposit',
  packQuantity: 'Pack quantity',
}

/** Which header (by its name as shown in `headers`) feeds each field; null = not in this file. */
export type ColumnMapping = Record<MappingField, string | null> & { stock: Record<string, string> }

/** The part types a new part may have (the catalogue's own list). */
export const PRICE_FILE_PART_TYPES = [
  'pad_set', 'disc', 'drum', 'shoe_set', 'caliper', 'wheel_cylinder', 'master_cylinder', 'hose', 'fluid', 'fitting_kit', 'wear_sensor',
] as const

/** The part types as a file may spell them for people ("Pad set", "Wheel cylinder"; any case, spaces or dashes). */
export const PRICE_FILE_PART_TYPE_NAMES: string = PRICE_FILE_PART_TYPES
  .map((t) => t.charAt(0).toUpperCase() + t.slice(1).replace(/_/g, ' ')).join(', ')

export interface PriceFileCounts {
  rows: number
  new: number
  changed: number
  unchanged: number
  missing: number
  rejected: number
  large: number
}

export interface PriceVersionSummary {
  id: number
  version: number
  label: string
  status: 'active' | 'retired' | 'scheduled'
  effectiveAt: string | null
  activatedAt: string | null
  createdBy: string | null
  priceFileId: number | null
  /** the file that made this version was rolled back */
  rolledBack: boolean
}

export interface PriceFileSummary {
  id: number
  status: PriceFileStatus
  fileName: string
  fileFormat: 'csv' | 'xlsx'
  supplierName: string
  progress: number
  counts: PriceFileCounts
  createdAt: string
  createdBy: string | null
  version: number | null
  effectiveAt: string | null
}

export interface MappingCheck {
  /** blocking: the check cannot run until these are fixed (keyed by mapping field) */
  problems: Partial<Record<MappingField | 'stock', string>>
  /** worth knowing, not blocking */
  notes: string[]
}

export interface PriceFileDetail extends PriceFileSummary {
  stage: string | null
  fileSize: number
  delimiter: string | null
  delimiterChosen: boolean
  decimalMark: '.' | ','
  encoding: string | null
  headers: string[]
  mapping: ColumnMapping | null
  mappingCheck: MappingCheck
  branchCodes: string[]
  errorMessage: string | null
  missingAction: MissingAction
  excludeRejected: boolean
  baseVersion: number | null
  activeVersion: number | null
  /** applied or scheduled: the version this file made and the one active before it */
  priceVersionId: number | null
  previousVersion: number | null
  appliedAt: string | null
  appliedBy: string | null
  rolledBackAt: string | null
  /** what the person may do next, as the server sees it */
  canApply: boolean
  canRollback: boolean
  canCancelSchedule: boolean
  canRecheck: boolean
}

export interface PriceChangeRow {
  id: number
  kind: ChangeKind
  rowNumber: number | null
  sku: string | null
  description: string | null
  partType: string | null
  oldListMinor: number | null
  newListMinor: number | null
  oldTradeMinor: number | null
  newTradeMinor: number | null
  oldCoreMinor: number | null
  newCoreMinor: number | null
  oldPack: number | null
  newPack: number | null
  changePct: number | null
  large: boolean
  stock: Record<string, number> | null
  columns: string | null
  reason: string | null
}

/** GET /api/price-files: one page of price files, with the latest versions and the remembered suppliers. */
export interface PriceFileList extends Page<PriceFileSummary> {
  versions: PriceVersionSummary[]
  activeVersion: number | null
  suppliers: string[]
}

/** People's words for each status (our own). */
export const PRICE_FILE_STATUS_LABELS: Record<PriceFileStatus, string> = {
  uploaded: 'Needs column choices',
  parsing: 'Checking',
  ready: 'Checked, not in use',
  failed: 'Could not be read',
  applying: 'Applying',
  applied: 'Applied',
  scheduled: 'Scheduled',
  rolled_back: 'Withdrawn',
}

/** What a running check is doing, in people's words (the detail's `stage`). */
export const CHECK_STAGE_LABELS: Record<string, string> = {
  queued: 'Waiting for the file ahead of it…',
  reading: 'Reading and checking rows…',
  comparing: 'Comparing with the prices in use…',
}

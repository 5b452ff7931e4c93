/**
 * GET /api/price-lists/:id/changes?kind=new|changed|unchanged|missing|rejected&page=&pageSize=
 *     &sort=row|sku|change|old|new&dir=asc|desc&q=<sku or description>&large=1&direction=up|down
 * -> { data: PriceChangeRow[], meta: { page, pageSize, total, pages } }
 * What the check found, one page at a time; sorting and filtering happen here, on the server.
 */
import { QueryTypes } from 'sequelize'
import { ChangesQuerySchema, UploadIdParamsSchema } from '#shared/schemas/price-lists'
import type { PriceChangeRow } from '#shared/types/price-lists'
import { getDb } from '../../../utils/db'
import { PriceUpload } from '../../../models/price-lists'

const SORT_SQL = {
  row: 'r.row_number IS NULL, r.row_number %DIR%, r.sku %DIR%',
  sku: 'r.sku %DIR%',
  change: 'r.change_pct IS NULL, r.change_pct %DIR%, r.sku ASC',
  old: 'r.old_list_minor IS NULL, r.old_list_minor %DIR%, r.sku ASC',
  new: 'r.new_list_minor IS NULL, r.new_list_minor %DIR%, r.sku ASC',
} as const

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceLists.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const q = queryWith(event, ChangesQuerySchema)
  const up = await PriceUpload.findByPk(id, { attributes: ['id'] })
  if (!up) throw notFound('Price file')

  const where = ['r.upload_id = $id', 'r.kind = $kind']
  const bind: Record<string, unknown> = { id, kind: q.kind }
  if (q.q) {
    where.push(`(r.sku LIKE $like ESCAPE '\\' OR COALESCE(r.description, p.description) LIKE $like ESCAPE '\\')`)
    bind.like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
  }
  if (q.large) where.push('r.large = 1')
  if (q.direction === 'up') where.push('r.new_list_minor > r.old_list_minor')
  if (q.direction === 'down') where.push('r.new_list_minor < r.old_list_minor')
  const from = `FROM price_upload_rows r LEFT JOIN parts p ON p.id = r.part_id WHERE ${where.join(' AND ')}`
  const [{ n }] = await getDb().query<{ n: number }>(`SELECT COUNT(*) AS n ${from}`, { bind, type: QueryTypes.SELECT }) as [{ n: number }]
  const order = SORT_SQL[q.sort].replaceAll('%DIR%', q.dir === 'desc' ? 'DESC' : 'ASC')
  const rows = await getDb().query<Record<string, unknown>>(
    `SELECT r.id, r.kind, r.row_number, r.sku, COALESCE(r.description, p.description) AS description, COALESCE(r.part_type, p.type) AS part_type,
            r.old_list_minor, r.new_list_minor, r.old_trade_minor, r.new_trade_minor, r.old_core_minor, r.new_core_minor,
            r.old_pack, r.new_pack, r.change_pct, r.large, r.stock, r.columns, r.reason
       ${from} ORDER BY ${order}, r.id ASC LIMIT ${q.pageSize} OFFSET ${(q.page - 1) * q.pageSize}`,
    { bind, type: QueryTypes.SELECT },
  )
  const data: PriceChangeRow[] = rows.map((r) => ({
    id: Number(r.id), kind: r.kind as PriceChangeRow['kind'], rowNumber: r.row_number as number | null, sku: r.sku as string | null,
    description: r.description as string | null, partType: r.part_type as string | null,
    oldListMinor: r.old_list_minor as number | null, newListMinor: r.new_list_minor as number | null,
    oldTradeMinor: r.old_trade_minor as number | null, newTradeMinor: r.new_trade_minor as number | null,
    oldCoreMinor: r.old_core_minor as number | null, newCoreMinor: r.new_core_minor as number | null,
    oldPack: r.old_pack as number | null, newPack: r.new_pack as number | null,
    changePct: r.change_pct as number | null, large: !!r.large,
    stock: r.stock ? JSON.parse(String(r.stock)) : null, columns: r.columns as string | null, reason: r.reason as string | null,
  }))
  return { data, meta: { page: q.page, pageSize: q.pageSize, total: Number(n), pages: Math.max(1, Math.ceil(Number(n) / q.pageSize)) } }
})

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { emptyMapping, columnIndex } from '../../../server/services/price-files/mapping'
import { rowValidator, type RowResult } from '../../../server/services/price-files/rows'
import { BatchReader, RowPacker, packedCsv, type RowBatch } from '../../../server/services/price-files/row-batches'
import { ChunkedList, expandFinding, storedFinding, type PriceCheckFinding } from '../../../server/services/price-files/findings'
import { PRICE_FILE_LIMITS, type ColumnMapping } from '#shared/types/price-files'

const headers = ['sku', 'description', 'type', 'list_price', 'trade_cost', 'core_deposit', 'pack_quantity', 'stock_NGT', 'stock_RVS']
const mapping: ColumnMapping = {
  ...emptyMapping(), sku: 'sku', description: 'description', type: 'type', listPrice: 'list_price', tradeCost: 'trade_cost',
  coreDeposit: 'core_deposit', packQuantity: 'pack_quantity', stock: { NGT: 'stock_NGT', RVS: 'stock_RVS' },
}
const job = { mapping, headers, decimal: '.' as const }

/** A mix of rows: complete, sparse (blank optional cells), refused, blank lines. */
function sampleRows(n: number): string[][] {
  const out: string[][] = []
  for (let i = 0; i < n; i++) {
    if (i % 97 === 5) out.push(['']) // a blank line
    else if (i % 50 === 7) out.push([`bad sku ${i}`, '', '', '12.345', '', '', '0', 'x', ''])
    else if (i % 3 === 0) out.push([`kf-${i}`, '', '', `${(i % 400) + 1}.5`, '', '', '', '', ''])
    else out.push([`KF-${i}`, `Pad  set ${i}`, 'Pad set', `${i % 900 + 1}.25`, `${i % 500 + 1}`, i % 4 ? '0' : '25.00', i % 5 ? '1' : '4', String(i % 40), String(i % 7)])
  }
  return out
}

function unpack(batches: RowBatch[]): { row: number; result: RowResult }[] {
  const out: { row: number; result: RowResult }[] = []
  for (const b of batches) {
    const rd = new BatchReader(b)
    for (let i = 0; i < b.n; i++) {
      if (rd.ok(i)) out.push({ row: rd.row(i), result: { ok: true, values: rd.values(i) } })
      else { const r = rd.refused(i); out.push({ row: rd.row(i), result: { ok: false, sku: r.sku, issues: r.issues, raw: r.raw } }) }
    }
  }
  return out
}

describe('packed row batches', () => {
  const dir = mkdtempSync(join(tmpdir(), 'boreline-batches-'))
  afterAll(() => rmSync(dir, { recursive: true, force: true }))

  it('give back exactly what the row validator says of each row, blank rows left out', () => {
    const rows = sampleRows(5_000)
    const packer = new RowPacker(job, 700, 50)
    const fileRows = rows.map((cells, i) => ({ rowNumber: i + 2, cells }))
    const batches = [...packer.add(fileRows.slice(0, 2_000), 0), ...packer.add(fileRows.slice(2_000), 0)]
    const last = packer.finish(0)
    if (last) batches.push(last)
    // the reference: the same validator called row by row
    const validator = rowValidator(mapping, columnIndex(mapping, headers), '.')
    const expected = fileRows.filter((r) => r.cells.some((c) => c.trim() !== '')).map((r) => ({ row: r.rowNumber, result: validator.validate(r.cells) }))
    expect(unpack(batches)).toEqual(expected)
    expect(packer.rowCount).toBe(expected.length)
    // batches start small and double up to the largest size
    expect(batches.slice(0, 5).map((b) => b.n)).toEqual([50, 100, 200, 400, 700])
    expect(batches.at(-1)!.count).toBe(expected.length)
  })

  it('read a CSV file after its header row, with the row numbers a spreadsheet shows', async () => {
    const path = join(dir, 'prices.csv')
    const rows = sampleRows(3_000)
    writeFileSync(path, [headers.join(','), ...rows.map((r) => r.join(','))].join('\r\n') + '\r\n')
    const batches: RowBatch[] = []
    for await (const b of packedCsv({ ...job, path, delimiter: ',', afterRow: 1 })) batches.push(b)
    const got = unpack(batches)
    expect(got[0]!.row).toBe(2)
    const refused = got.filter((g) => !g.result.ok)
    expect(refused.length).toBe(rows.filter((r, i) => r.length > 1 && i % 50 === 7).length)
    expect(refused[0]).toMatchObject({ row: 9, result: { ok: false, sku: 'bad sku 7' } })
    const kf3 = got.find((g) => g.result.ok && g.result.values.sku === 'KF-3')
    expect(kf3).toEqual({ row: 5, result: { ok: true, values: { sku: 'KF-3', description: undefined, type: undefined, listMinor: 450, tradeMinor: undefined, coreMinor: undefined, pack: undefined, stock: null } } })
  })

  it(`refuse a file of more than ${PRICE_FILE_LIMITS.maxRows.toLocaleString('en-GB')} data rows`, () => {
    const packer = new RowPacker(job)
    const row = { rowNumber: 2, cells: ['KF-1', '', '', '1.00', '', '', '', '', ''] }
    const rows = Array.from({ length: PRICE_FILE_LIMITS.maxRows }, () => row)
    packer.add(rows, 0)
    expect(() => packer.add([row], 0)).toThrow(/more than 200,000 data rows/)
  })
})

describe('stored findings', () => {
  // the reference for "nothing lost" is the full tuple itself, compared after a JSON round trip (JSON.parse/stringify)
  const roundTrip = (kind: string, f: PriceCheckFinding) => expandFinding(kind, JSON.parse(JSON.stringify(storedFinding(kind, [...f] as PriceCheckFinding))))

  it('keep every value of an unchanged part in the short form', () => {
    const f: PriceCheckFinding = [12, 'KF-1', 7, null, null, 4820, 4820, 3010, 3010, 0, 0, null, 1, 0, 0, { NGT: 3 }, null, null, null]
    expect(storedFinding('unchanged', [...f] as PriceCheckFinding)).toHaveLength(9)
    expect(roundTrip('unchanged', f)).toEqual(f)
    const back: PriceCheckFinding = [13, 'KF-2', 8, null, null, 100, 100, null, null, 250, 250, 2, 2, 0, 0, null, null, 'Discontinued now: back in use when this file is applied.', null]
    expect(roundTrip('unchanged', back)).toEqual(back)
  })

  it('leave off trailing nulls of the other kinds and pad them again', () => {
    const changed: PriceCheckFinding = [2, 'KF-3', 9, null, null, 1000, 1450, 600, 899, 0, 0, 1, 1, 45, 1, { NGT: 4, RVS: 0 }, null, null, null]
    expect(storedFinding('changed', [...changed] as PriceCheckFinding)).toHaveLength(16)
    expect(roundTrip('changed', changed)).toEqual(changed)
    const fresh: PriceCheckFinding = [3, 'KF-NEW', null, 'disc', 'Front disc 280 mm', null, 5200, null, null, null, 0, null, 1, null, 0, null, null, null, null]
    expect(roundTrip('new', fresh)).toEqual(fresh)
  })

  it('keep every value of a new part and of a missing part in their short forms, and read the full forms as before', () => {
    const fresh: PriceCheckFinding = [3, 'KF-NEW', null, 'disc', 'Front disc 280 mm', null, 5200, null, 3100, null, 0, null, 1, null, 0, { NGT: 4, RVS: 0 }, null, null, null]
    // worked by hand: row, SKU, type, description, list, trade, core, pack, stock
    expect(storedFinding('new', [...fresh] as PriceCheckFinding)).toEqual([3, 'KF-NEW', 'disc', 'Front disc 280 mm', 5200, 3100, 0, 1, { NGT: 4, RVS: 0 }])
    expect(roundTrip('new', fresh)).toEqual(fresh)
    const missing: PriceCheckFinding = [null, 'KF-GONE', 41, null, null, 2500, null, null, null, 0, null, 2, null, null, 0, null, null, null, null]
    // a missing part is now stored as its id alone (compare.ts); the short tuple checks made before that wrote is
    // still read: worked by hand, the part id third, then list, trade, core and pack
    expect(expandFinding('missing', [null, 'KF-GONE', 41, 2500, null, 0, 2])).toEqual(missing)
    // findings stored before the short forms: the full tuple, trailing nulls left off (at least 15 long)
    expect(expandFinding('new', JSON.parse(JSON.stringify(fresh.slice(0, 16))))).toEqual(fresh)
    expect(expandFinding('missing', JSON.parse(JSON.stringify(missing.slice(0, 15))))).toEqual(missing)
  })

  it('a chunked list gives back every item by index, and drops the ones asked for', () => {
    const list = new ChunkedList<number[]>(50, 7)
    for (let i = 0; i < 173; i++) list.push([i])
    expect([list.get(0), list.get(49), list.get(50), list.get(120), list.get(172), list.get(173)]).toEqual([[0], [49], [50], [120], [172], undefined])
    list.remove([3, 60, 172])
    const items = list.chunks.flatMap((c) => JSON.parse(c.json) as number[][])
    // the reference: the same items in a plain array, filtered
    expect(items).toEqual(Array.from({ length: 173 }, (_, i) => [i]).filter(([i]) => ![3, 60, 172].includes(i!)))
    expect(list.length).toBe(170)
    expect(list.chunks.reduce((n, c) => n + c.size, 0)).toBe(170)
  })
})

/**
 * A worksheet's shape read from its raw XML before any reader walks its cells. Column letters as ECMA-376 Part 1
 * 18.3.1.4 spells cell references (A = 1, Z = 26, AA = 27; XFD = 16,384 is the last column, as Excel's published
 * "specifications and limits" give it: 16,384 columns). Worked by hand: CV = 3 x 26 + 22 = 100.
 */
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { columnNumber, sheetShapeScan } from '../../../server/services/price-files/sheet-shape'
import { inspectZip, proveZipSizes } from '../../../server/services/price-files/zip-safety'
import { wideXlsx } from '../../support/probe'

const limits = { maxRows: 200_000, maxColumns: 100 } as Parameters<typeof sheetShapeScan>[0]

describe('worksheet shape', () => {
  it('numbers columns as a spreadsheet does', () => {
    expect(columnNumber('A')).toBe(1)
    expect(columnNumber('Z')).toBe(26)
    expect(columnNumber('AA')).toBe(27)
    expect(columnNumber('CV')).toBe(100) // 3 x 26 + 22
    expect(columnNumber('xfd')).toBe(16_384) // 24 x 676 + 6 x 26 + 4
  })

  it('refuses a cell beyond column CV, even when its tag is cut between two chunks', () => {
    const scan = sheetShapeScan(limits)
    scan.push(Buffer.from('<sheetData><row r="1"><c r="A1"><v>1</v></c><c r="CV1"><v>2</v></c></row><row r="7"><c r="B7"/><c r="XF'))
    expect(() => scan.push(Buffer.from('D7" t="s"><v>0</v></c></row></sheetData>'))).toThrow(/Row 7 has a cell in column XFD/)
  })

  it('counts cells without references along their row', () => {
    const scan = sheetShapeScan(limits)
    expect(() => scan.push(Buffer.from(`<row r="3">${'<c><v>1</v></c>'.repeat(101)}</row>`))).toThrow(/Row 3 has a cell in column CW/)
  })

  it('refuses too many rows before reading their cells (50 rows above the header allowed)', () => {
    const scan = sheetShapeScan({ ...limits, maxRows: 10 })
    expect(() => scan.push(Buffer.from(`${'<row/>'.repeat(61)}</sheetData>`))).toThrow(/more than 10 data rows/)
  })

  it('refuses 20,000 rows reaching column XFD while the zip is proven, in well under a second', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'sheet-shape-')), 'wide.xlsx')
    writeFileSync(path, wideXlsx(20_000))
    const t0 = performance.now()
    await expect(proveZipSizes(path, await inspectZip(path))).rejects.toThrow(/Row 2 has a cell in column XFD/)
    expect(performance.now() - t0).toBeLessThan(1000)
  })
})

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import ExcelJS from 'exceljs'
import { PRICE_FILE_LIMITS } from '#shared/types/price-files'
import { PriceFileError } from '../../../server/services/price-files/file-rows'
import { sniffPriceFile } from '../../../server/services/price-files/file-kind'
import { inspectZip, proveZipSizes } from '../../../server/services/price-files/zip-safety'
import { firstInvalidUtf8, locateInvalidUtf8 } from '../../../server/services/price-files/utf8'
import { csvRows, detectDelimiter } from '../../../server/services/price-files/csv-rows'
import { xlsxCellText, xlsxRows } from '../../../server/services/price-files/xlsx-rows'
import { buildZip } from './zip-fixture'

const dir = mkdtempSync(join(tmpdir(), 'price-read-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))
let n = 0
function file(content: string | Buffer, ext = 'bin'): string {
  const p = join(dir, `f${++n}.${ext}`)
  writeFileSync(p, content)
  return p
}
async function all(path: string, delimiter = ','): Promise<{ rowNumber: number; cells: string[] }[]> {
  const out = []
  for await (const batch of csvRows(path, delimiter).rows) out.push(...batch)
  return out
}

describe('file kind from the bytes', () => {
  it('takes CSV text for CSV whatever the name, and notes a BOM', async () => {
    expect(await sniffPriceFile(file('sku,list_price\nA-1,2.00\n', 'xlsx'))).toEqual({ format: 'csv', bom: false })
    expect(await sniffPriceFile(file(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('sku\nA1\n')])))).toEqual({ format: 'csv', bom: true })
  })

  it('recognises a real XLSX written by exceljs even when it is named .csv', async () => {
    const wb = new ExcelJS.Workbook()
    wb.addWorksheet('Prices').addRow(['sku', 'list_price'])
    const p = join(dir, 'real-workbook.csv')
    await wb.xlsx.writeFile(p)
    expect((await sniffPriceFile(p)).format).toBe('xlsx')
  })

  it('refuses a PNG named .csv, a PDF, a plain zip, UTF-16 and binary data, saying what it is', async () => {
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489', 'hex')
    await expect(sniffPriceFile(file(png, 'csv'))).rejects.toThrow(/PNG image/)
    await expect(sniffPriceFile(file('%PDF-1.7\n1 0 obj\n<<>>\nendobj\n', 'csv'))).rejects.toThrow(/PDF document/)
    await expect(sniffPriceFile(file(buildZip([{ name: 'notes.txt', data: Buffer.from('hello') }]), 'xlsx'))).rejects.toThrow(/zip archive/)
    await expect(sniffPriceFile(file(Buffer.from('\ufeffsku\n', 'utf16le'), 'csv'))).rejects.toThrow(/UTF-16/)
    await expect(sniffPriceFile(file(Buffer.from([0x41, 0x00, 0x42, 0x01, 0x02]), 'csv'))).rejects.toThrow(/binary/)
  })

  it('calls an empty file empty (0 bytes, a BOM alone, blank lines)', async () => {
    for (const c of [Buffer.alloc(0), Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('\n\n  \r\n')]) {
      await expect(sniffPriceFile(file(c))).rejects.toMatchObject({ code: 'empty' })
    }
  })
})

describe('UTF-8 validation', () => {
  // Reference: the WHATWG Encoding Standard decoder (Node's TextDecoder with fatal: true) on the same bytes.
  const fatal = new TextDecoder('utf-8', { fatal: true })
  const valid = (b: Buffer) => { try { fatal.decode(b); return true } catch { return false } }
  const samples = [
    'plain ascii', 'Bremsbeläge £12.50 €', '日本語', '😀 emoji', // valid
  ].map((s) => Buffer.from(s))
  const broken = [
    Buffer.from([0x41, 0xa3, 0x31]), // Latin-1 pound sign
    Buffer.from([0xc0, 0xaf]), // overlong "/"
    Buffer.from([0xed, 0xa0, 0x80]), // surrogate U+D800
    Buffer.from([0xf4, 0x90, 0x80, 0x80]), // above U+10FFFF
    Buffer.from([0xe2, 0x82]), // cut short
    Buffer.from([0x41, 0x42, 0xe9, 0x43]), // Windows-1252 é
  ]

  it('agrees with the WHATWG decoder on valid and invalid sequences', () => {
    for (const b of [...samples, ...broken]) expect(firstInvalidUtf8(b) === -1).toBe(valid(b))
  })

  it('finds the line and byte of the first bad byte across chunk boundaries', async () => {
    const good = 'sku,description,list_price\n' + Array.from({ length: 60_000 }, (_, i) => `KF-${i},Scheibe ø280 mm,12.50\n`).join('')
    const bad = Buffer.concat([Buffer.from(good), Buffer.from('KF-X,Bremsbel'), Buffer.from([0xe4]), Buffer.from('ge,9.99\n')])
    const at = await locateInvalidUtf8(file(bad))
    expect(at).toEqual({ line: 60_002, offset: Buffer.byteLength(good) + 13, byte: 0xe4 })
    expect(await locateInvalidUtf8(file(good))).toBeNull()
  })

  it('reads a character split across two read chunks (at 256 KB, a multiple of the 64 KB read size) as one', async () => {
    const lines = ['sku,description']
    while (Buffer.byteLength(lines.join('\n')) < 256 * 1024 - 200) lines.push(`KF-${lines.length},${'A'.repeat(60)}`)
    const before = Buffer.byteLength(lines.join('\n') + '\n')
    const prefix = 'KF-X,' + 'B'.repeat(256 * 1024 - 1 - before - 5) // "ø" (two bytes) starts on the last byte of the first chunk
    const p = file(`${lines.join('\n')}\n${prefix}ø end\n`)
    expect(Buffer.byteLength(`${lines.join('\n')}\n${prefix}`)).toBe(256 * 1024 - 1)
    const rows = await all(p)
    expect(rows.at(-1)!.cells[1]).toBe(`${prefix.slice(5)}ø end`)
  })

  it('ends the CSV read with a message naming the line and the encoding', async () => {
    const p = file(Buffer.concat([Buffer.from('sku,list_price\nA-1,2.00\nA-2,3'), Buffer.from([0xa3]), Buffer.from('\n')]))
    await expect(all(p)).rejects.toThrow(/not valid UTF-8 text: line 3 has the byte 0xA3.*Windows-1252/)
  })
})

describe('CSV reading', () => {
  it('detects comma, semicolon and tab from the header line, ignoring quoted text', () => {
    expect(detectDelimiter('sku,description,list_price')).toBe(',')
    expect(detectDelimiter('sku;description;list_price')).toBe(';')
    expect(detectDelimiter('sku\tdescription\tlist_price')).toBe('\t')
    expect(detectDelimiter('"a;b;c";x,y')).toBe(',')
  })

  it('reads RFC 4180 quoting (embedded delimiter, doubled quote, line break) and strips a BOM', async () => {
    // RFC 4180 §2 rules 5-7: fields with commas, quotes and line breaks are quoted; quotes are doubled.
    const p = file('\ufeffsku,description,list_price\r\nA-1,"Pad set, front ""ceramic""",12.50\r\nA-2,"two\r\nlines",3.00\r\n')
    const rows = await all(p)
    expect(rows.map((r) => r.cells)).toEqual([
      ['sku', 'description', 'list_price'],
      ['A-1', 'Pad set, front "ceramic"', '12.50'],
      ['A-2', 'two\r\nlines', '3.00'],
    ])
    expect(rows.map((r) => r.rowNumber)).toEqual([1, 2, 3])
  })

  it('reports an unclosed quote with its row, and keeps a quote inside an unquoted cell as text', async () => {
    await expect(all(file('sku,list_price\nA-1,"12.50\nA-2,3.00\n'))).rejects.toThrow(/at row 2: a quoted cell is never closed/)
    // a quote inside an unquoted cell is text (RFC 4180 only gives quotes meaning at the start of a cell); the price check then refuses that row
    const rows = await all(file('sku,list_price\nA-1,12" disc,\n'))
    expect(rows[1]!.cells).toEqual(['A-1', '12" disc', ''])
  })

  it('reads semicolon files with decimal commas as text cells', async () => {
    const rows = await all(file('sku;list_price\nA-1;12,50\n'), ';')
    expect(rows[1]!.cells).toEqual(['A-1', '12,50'])
  })
})

describe('XLSX cells and rows', () => {
  it('turns exceljs cell values into text; formulas keep their "=" so the checks refuse them', () => {
    expect(xlsxCellText(12.5, '.')).toBe('12.5')
    expect(xlsxCellText(12.5, ',')).toBe('12,5')
    expect(xlsxCellText({ formula: 'B2*2', result: 25 }, '.')).toBe('=B2*2')
    expect(xlsxCellText({ richText: [{ text: 'Pad ' }, { text: 'set' }] }, '.')).toBe('Pad set')
    expect(xlsxCellText(null, '.')).toBe('')
  })

  it('streams the first worksheet with spreadsheet row numbers', async () => {
    const wb = new ExcelJS.Workbook()
    const ws = wb.addWorksheet('Prices')
    ws.addRow(['sku', 'list_price'])
    ws.addRow(['KF-1', 12.5])
    ws.addRow([])
    ws.addRow(['KF-2', { formula: 'B2*2', result: 25 }])
    wb.addWorksheet('Other').addRow(['ignored'])
    const p = join(dir, 'rows.xlsx')
    await wb.xlsx.writeFile(p)
    const entries = await inspectZip(p)
    await proveZipSizes(p, entries)
    const out = []
    for await (const batch of xlsxRows(p, '.').rows) out.push(...batch)
    expect(out.filter((r) => r.cells.length).map((r) => [r.rowNumber, r.cells])).toEqual([
      [1, ['sku', 'list_price']], [2, ['KF-1', '12.5']], [4, ['KF-2', '=B2*2']],
    ])
  })
})

describe('zip safety before inflating', () => {
  it('accepts an honest zip and lists its entries', async () => {
    const p = file(buildZip([{ name: 'a.xml', data: Buffer.from('<a/>') }, { name: 'b.xml', data: Buffer.from('<b/>'), store: true }]))
    expect((await inspectZip(p)).map((e) => e.name)).toEqual(['a.xml', 'b.xml'])
  })

  it('refuses too many entries', async () => {
    const many = Array.from({ length: PRICE_FILE_LIMITS.maxZipEntries + 1 }, (_, i) => ({ name: `x${i}`, data: Buffer.from('x'), store: true }))
    await expect(inspectZip(file(buildZip(many)))).rejects.toMatchObject({ code: 'zip_bomb' })
  })

  it('refuses a declared inflated size over the limit, and a ratio no workbook has', async () => {
    const zeros = Buffer.alloc(20 * 1024 * 1024) // 20 MB of zeros deflate ~1000:1
    await expect(inspectZip(file(buildZip([{ name: 'xl/worksheets/sheet1.xml', data: zeros }])))).rejects.toThrow(/inflates \d+ times/)
    const liar = buildZip([{ name: 'big', data: Buffer.from('x'), declaredSize: PRICE_FILE_LIMITS.maxZipInflatedBytes + 1, store: false }])
    await expect(inspectZip(file(liar))).rejects.toThrow(/more than 800 MB/)
  })

  it('refuses entries that share bytes (overlapping-entry bombs)', async () => {
    const z = buildZip([{ name: 'a', data: Buffer.from('hello hello') }, { name: 'b', data: Buffer.from('hello hello'), shareWith: 0 }])
    await expect(inspectZip(file(z))).rejects.toThrow(/share the same bytes/)
  })

  it('catches an entry that inflates beyond what the directory declares', async () => {
    const data = Buffer.alloc(512 * 1024, 'a')
    const p = file(buildZip([{ name: 'sheet.xml', data, declaredSize: 1000 }]))
    const entries = await inspectZip(p) // the declared sizes alone look harmless
    await expect(proveZipSizes(p, entries)).rejects.toThrow(/beyond its declared size/)
  })

  it('is not fooled by a file without a zip directory', async () => {
    await expect(inspectZip(file('PK\u0003\u0004 not really'))).rejects.toBeInstanceOf(PriceFileError)
  })
})

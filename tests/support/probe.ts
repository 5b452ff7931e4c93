/**
 * Watching the server while a test pushes it: its resident memory (from /proc, the kernel's own count), how long
 * /api/health takes to answer meanwhile, and requests shaped as an attacker would send them (a chunked body with no
 * length, a body of any type).
 */
import { readFileSync } from 'node:fs'
import { request as httpRequest } from 'node:http'
import { buildZip } from '../unit/price-files/zip-fixture'
import { env } from './api'

/** The server's resident memory now, in MB (VmRSS of /proc/<pid>/status). */
export function serverRssMb(): number {
  const status = readFileSync(`/proc/${env().serverPid}/status`, 'utf8')
  const kb = Number(/VmRSS:\s+(\d+)\s+kB/.exec(status)?.[1])
  return kb / 1024
}

export interface Watch { peakRssMb: number; slowestHealthMs: number; healthChecks: number; stop: () => Promise<Watch> }

/**
 * Samples memory every 50 ms and asks /api/health over and over (one at a time) until `stop()`; the slowest answer
 * and the peak memory are what the person at the counter would have felt.
 */
export function watchServer(): Watch {
  const w: Watch = { peakRssMb: serverRssMb(), slowestHealthMs: 0, healthChecks: 0, stop: async () => w }
  let running = true
  const sampler = setInterval(() => { try { w.peakRssMb = Math.max(w.peakRssMb, serverRssMb()) } catch { /* gone */ } }, 50)
  const health = (async () => {
    while (running) {
      const t0 = performance.now()
      const r = await fetch(`${env().baseUrl}/api/health`)
      await r.text()
      w.slowestHealthMs = Math.max(w.slowestHealthMs, performance.now() - t0)
      w.healthChecks++
      await new Promise((r) => setTimeout(r, 25))
    }
  })()
  w.stop = async () => {
    running = false
    clearInterval(sampler)
    await health
    w.peakRssMb = Math.max(w.peakRssMb, serverRssMb())
    return w
  }
  return w
}

/**
 * POSTs a body of `totalBytes` in 64 KB pieces, stopping as soon as the answer arrives (as a browser or curl does
 * when a server answers early): with no Content-Length (`Transfer-Encoding: chunked`), or with `declared` the length
 * is announced up front. Returns the answer and how much was sent by then.
 */
export function postChunked(
  path: string, totalBytes: number, contentType = 'application/json', localAddress?: string, declared = false,
): Promise<{ status: number; body: any; sentBytes: number; ms: number }> {
  const url = new URL(path, env().baseUrl)
  const t0 = performance.now()
  return new Promise((resolve, reject) => {
    let sent = 0
    let answered = false
    const req = httpRequest({
      host: url.hostname, port: url.port, path: url.pathname, method: 'POST', agent: false, ...(localAddress ? { localAddress } : {}),
      headers: { 'content-type': contentType, ...(declared ? { 'content-length': String(totalBytes) } : { 'transfer-encoding': 'chunked' }) },
    }, (res) => {
      answered = true
      const at = sent
      let text = ''
      res.setEncoding('utf8')
      res.on('data', (d) => { text += d })
      res.on('end', () => {
        let body: any = text
        try { body = JSON.parse(text) } catch { /* not JSON */ }
        req.destroy()
        resolve({ status: res.statusCode ?? 0, body, sentBytes: at, ms: performance.now() - t0 })
      })
    })
    req.on('error', (err) => { if (!answered) reject(err) })
    const chunk = Buffer.alloc(64 * 1024, 0x20)
    chunk.write('{"email":"')
    // one piece at a time with a pause between, so an early answer is read before the server closes the
    // connection (a write after that fails with EPIPE and the kernel drops what was not read yet)
    const pump = async () => {
      while (!answered && !req.destroyed && sent < totalBytes) {
        await new Promise<void>((done) => req.write(chunk, () => done()))
        sent += chunk.length
        await new Promise((r) => setTimeout(r, 2))
      }
      if (!answered && !req.destroyed) req.end()
    }
    void pump()
  })
}

/**
 * An XLSX price file written by hand (ECMA-376 SpreadsheetML, the parts a reader needs), `rows` data rows each with
 * one more cell far to the right in column XFD, the last a spreadsheet has: small on disk, 16,384 columns wide.
 * (exceljs itself takes over a minute to write such a sheet.)
 */
export function wideXlsx(rows: number): Buffer {
  const main = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main'
  const rels = 'http://schemas.openxmlformats.org/package/2006/relationships'
  const doc = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships'
  const text = (ref: string, t: string) => `<c r="${ref}" t="inlineStr"><is><t>${t}</t></is></c>`
  const body = [`<row r="1">${text('A1', 'sku')}${text('B1', 'list_price')}</row>`]
  for (let i = 0; i < rows; i++) body.push(`<row r="${i + 2}">${text(`A${i + 2}`, `WX-${i}`)}<c r="B${i + 2}"><v>12.5</v></c>${text(`XFD${i + 2}`, 'x')}</row>`)
  const xml = (s: string) => Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n${s}`)
  return buildZip([
    { name: '[Content_Types].xml', data: xml(`<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/></Types>`) },
    { name: '_rels/.rels', data: xml(`<Relationships xmlns="${rels}"><Relationship Id="rId1" Type="${doc}/officeDocument" Target="xl/workbook.xml"/></Relationships>`) },
    { name: 'xl/workbook.xml', data: xml(`<workbook xmlns="${main}" xmlns:r="${doc}"><sheets><sheet name="Prices" sheetId="1" r:id="rId1"/></sheets></workbook>`) },
    { name: 'xl/_rels/workbook.xml.rels', data: xml(`<Relationships xmlns="${rels}"><Relationship Id="rId1" Type="${doc}/worksheet" Target="worksheets/sheet1.xml"/></Relationships>`) },
    { name: 'xl/worksheets/sheet1.xml', data: xml(`<worksheet xmlns="${main}"><sheetData>${body.join('')}</sheetData></worksheet>`) },
  ])
}

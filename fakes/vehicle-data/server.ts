/**
 * Local stand-in for a hosted vehicle-data service: a registration in, the vehicle the licensing records hold out.
 *
 *   GET /v1/vehicles/:registration   header `x-api-key: <key>`
 *     200 { registration, make, model, variant, yearOfManufacture, firstRegistered, engineCapacityCc, fuelType, colour, vin }
 *     400 malformed registration, 401 wrong or missing key, 404 unknown: `{ error: { code, message } }`
 *
 * Test-only control routes under `/_fake/`: `POST /_fake/mode { mode: 'normal' | 'unavailable' | 'down' | 'slow',
 * delayMs? }` (unavailable answers 503; down drops the connection; slow waits delayMs, default 10 s, before
 * answering), `GET /_fake/requests`, `POST /_fake/reset`, `GET /_fake/health`. Inputs are checked with zod.
 */
import { once } from 'node:events'
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import { z } from 'zod'
import { FAKE_VEHICLES, type FakeVehicle } from './data'

export type FakeMode = 'normal' | 'unavailable' | 'down' | 'slow'

export interface VehicleDataFakeOptions {
  /** 0 (or absent) picks a free port */
  port?: number
  host?: string
  apiKey?: string
  vehicles?: readonly FakeVehicle[]
}

export interface VehicleDataState {
  mode: FakeMode
  delayMs: number
  requests: { at: string; method: string; path: string; registration: string | null; status: number }[]
}

export interface VehicleDataFake {
  listen(): Promise<{ port: number; url: string }>
  close(): Promise<void>
  state: VehicleDataState
}

export const DEFAULT_VEHICLE_DATA_KEY = 'vd_test_boreline_local'

const RegistrationParam = z.string().transform((s) => decodeURIComponent(s).replace(/[\s-]+/g, '').toUpperCase())
  .pipe(z.string().regex(/^[A-Z0-9]{2,8}$/, 'A registration is 2 to 8 letters and digits.'))
const ModeBody = z.strictObject({
  mode: z.enum(['normal', 'unavailable', 'down', 'slow'], { error: 'mode is normal, unavailable, down or slow' }),
  delayMs: z.number().int().min(0).max(120_000).optional(),
})

function send(res: http.ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body)
  res.writeHead(status, { 'content-type': 'application/json', 'content-length': Buffer.byteLength(text), 'cache-control': 'no-store' })
  res.end(text)
}

function readJson(req: http.IncomingMessage): Promise<unknown> {
  return new Promise((resolve, reject) => {
    let raw = ''
    req.on('data', (c: Buffer) => { raw += c.toString('utf8'); if (raw.length > 10_000) req.destroy() })
    req.on('end', () => { try { resolve(raw.trim() ? JSON.parse(raw) : {}) } catch (e) { reject(e) } })
    req.on('error', reject)
  })
}

const emptyState = (): VehicleDataState => ({ mode: 'normal', delayMs: 10_000, requests: [] })

export function createVehicleDataFake(options: VehicleDataFakeOptions = {}): VehicleDataFake {
  const host = options.host ?? '127.0.0.1'
  const apiKey = options.apiKey ?? DEFAULT_VEHICLE_DATA_KEY
  const byRegistration = new Map((options.vehicles ?? FAKE_VEHICLES).map((v) => [v.registration, v]))
  const state = emptyState()
  const timers = new Set<NodeJS.Timeout>()

  async function control(req: http.IncomingMessage, res: http.ServerResponse, path: string): Promise<void> {
    if (req.method === 'GET' && path === '/_fake/health') return send(res, 200, { ok: true })
    if (req.method === 'GET' && path === '/_fake/requests') return send(res, 200, { data: state.requests })
    if (req.method === 'POST' && path === '/_fake/reset') { Object.assign(state, emptyState()); return send(res, 200, { ok: true }) }
    if (req.method === 'POST' && path === '/_fake/mode') {
      const parsed = ModeBody.safeParse(await readJson(req).catch(() => null))
      if (!parsed.success) return send(res, 400, { error: { code: 'bad_request', message: parsed.error.issues[0]?.message ?? 'Invalid body.' } })
      state.mode = parsed.data.mode
      if (parsed.data.delayMs !== undefined) state.delayMs = parsed.data.delayMs
      return send(res, 200, { mode: state.mode, delayMs: state.delayMs })
    }
    return send(res, 404, { error: { code: 'not_found', message: `Unknown control route: ${req.method} ${path}` } })
  }

  function lookup(req: http.IncomingMessage, res: http.ServerResponse, raw: string): void {
    const record = (status: number, registration: string | null) =>
      state.requests.push({ at: new Date().toISOString(), method: req.method ?? 'GET', path: req.url ?? '', registration, status })
    if (state.mode === 'down') { record(0, null); res.destroy(); return }
    if (state.mode === 'unavailable') { record(503, null); return send(res, 503, { error: { code: 'unavailable', message: 'The service is down for maintenance.' } }) }
    if (req.headers['x-api-key'] !== apiKey) { record(401, null); return send(res, 401, { error: { code: 'unauthorised', message: 'A valid x-api-key header is required.' } }) }
    const reg = RegistrationParam.safeParse(raw)
    if (!reg.success) { record(400, null); return send(res, 400, { error: { code: 'bad_request', message: reg.error.issues[0]?.message ?? 'Invalid registration.' } }) }
    const vehicle = byRegistration.get(reg.data)
    record(vehicle ? 200 : 404, reg.data)
    if (!vehicle) return send(res, 404, { error: { code: 'not_found', message: 'No vehicle is registered with that mark.' } })
    send(res, 200, vehicle)
  }

  const server = http.createServer((req, res) => {
    const path = new URL(req.url ?? '/', 'http://fake.invalid').pathname
    if (path.startsWith('/_fake/')) {
      control(req, res, path).catch((e: unknown) => send(res, 500, { error: { code: 'internal', message: String(e) } }))
      return
    }
    const m = /^\/v1\/vehicles\/([^/]+)$/.exec(path)
    if (!m || req.method !== 'GET') return send(res, 404, { error: { code: 'not_found', message: `Unknown route: ${req.method} ${path}` } })
    if (state.mode === 'slow') {
      const timer = setTimeout(() => { timers.delete(timer); if (!res.destroyed) lookup(req, res, m[1]!) }, state.delayMs)
      timers.add(timer)
      return
    }
    lookup(req, res, m[1]!)
  })

  return {
    state,
    async listen() {
      // node:events' once() rejects on 'error' (a port in use) and resolves on 'listening'
      server.listen(options.port ?? 0, host)
      await once(server, 'listening')
      const { port } = server.address() as AddressInfo
      return { port, url: `http://${host}:${port}` }
    },
    async close() {
      for (const t of timers) clearTimeout(t)
      timers.clear()
      if (!server.listening) return
      const closed = once(server, 'close')
      server.close()
      server.closeAllConnections()
      await closed
    },
  }
}

/**
 * Local stand-in for the hosted card-payment API, driven by the official `stripe` SDK.
 *
 * The SDK is pointed at it with `{ host, port, protocol: 'http' }`. It keeps everything in memory, speaks
 * the wire format the SDK uses (bracketed form bodies in, JSON out, status code chooses the error class),
 * serves a small hosted payment page at each Checkout Session's `url`, and delivers signed webhook events
 * with bounded retries. Test-only control routes live under `/_fake/`.
 *
 * This file starts the HTTP server and sends each request to its part: `/v1/` to api.ts, `/pay/` to
 * hosted-page.ts, `/_fake/` to control.ts. Behaviours marked "observed SDK behaviour" were seen by running
 * stripe@23.1.0 against a logging server; those marked "API reference (from memory)" follow the public API
 * reference as recalled, without the page at hand.
 */
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import { apiHandler } from './api'
import type { Fake } from './context'
import { controlHandler } from './control'
import { hostedPageHandler } from './hosted-page'
import { sendJson } from './http'
import { emptyState, type FakeConfig, type FakeState } from './store'
import { WebhookSender } from './webhooks'

export type { FakeConfig, FakeState } from './store'

export interface PaymentsFakeOptions {
  /** 0 (or absent) picks a free port. */
  port?: number
  /** Defaults to 127.0.0.1. */
  host?: string
  /** Where signed events are POSTed. Without one, events are recorded but not delivered. */
  webhookUrl?: string
  /** The whole `whsec_...` string is the HMAC key. */
  webhookSecret?: string
  /** Base of the hosted page URLs; defaults to `http://<host>:<port>`. */
  publicUrl?: string
  /** Event `api_version` until a request brings its own `Stripe-Version`. */
  apiVersion?: string
  /** Bounded delivery: total attempts per event (default 5). */
  webhookMaxAttempts?: number
  /** Back-off base; attempt n waits base * 2^(n-1) ms (default 1000). */
  webhookRetryBaseMs?: number
  /** Per-attempt timeout (default 10000 ms). */
  webhookTimeoutMs?: number
  /** Event types delivered to the endpoint (default all); others are still recorded. */
  enabledEvents?: string[]
}

export interface PaymentsFake {
  listen(): Promise<{ port: number; url: string }>
  close(): Promise<void>
  state: FakeState
}

const DEFAULT_API_VERSION = '2026-10-28.endive' // the version pinned by stripe@23.1.0 (observed SDK behaviour)

function configOf(options: PaymentsFakeOptions): FakeConfig {
  return {
    webhookUrl: options.webhookUrl ?? null,
    webhookSecret: options.webhookSecret ?? 'whsec_boreline_local_secret',
    webhookMaxAttempts: Math.max(1, options.webhookMaxAttempts ?? 5),
    webhookRetryBaseMs: Math.max(0, options.webhookRetryBaseMs ?? 1000),
    webhookTimeoutMs: Math.max(1, options.webhookTimeoutMs ?? 10_000),
    enabledEvents: options.enabledEvents ?? ['*'],
  }
}

export function createPaymentsFake(options: PaymentsFakeOptions = {}): PaymentsFake {
  const host = options.host ?? '127.0.0.1'
  const apiVersion = options.apiVersion ?? DEFAULT_API_VERSION
  const state = emptyState(configOf(options), apiVersion)
  const webhooks = new WebhookSender(state)
  const fake: Fake = {
    state,
    webhooks,
    publicUrl: options.publicUrl ?? '',
    now: () => Math.floor(Date.now() / 1000) + state.clockOffset,
    reset() {
      webhooks.cancel()
      // In place, so `fake.state` held by a test stays the live store.
      Object.assign(state, emptyState(state.config, apiVersion))
    },
  }
  const handlers = { '/v1/': apiHandler(fake), '/pay/': hostedPageHandler(fake), '/_fake/': controlHandler(fake) }

  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://fake.invalid')
    const prefix = (Object.keys(handlers) as (keyof typeof handlers)[]).find((p) => url.pathname.startsWith(p))
    const task = prefix
      ? handlers[prefix](req, res, url)
      : Promise.resolve(sendJson(res, 404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${url.pathname}).` } }))
    task.catch((e: unknown) => {
      if (!res.headersSent) sendJson(res, 500, { error: { type: 'api_error', message: e instanceof Error ? e.message : String(e) } })
      else res.destroy()
    })
  })

  return {
    state,
    listen() {
      return new Promise((resolve, reject) => {
        server.once('error', reject)
        server.listen(options.port ?? 0, host, () => {
          server.off('error', reject)
          const port = (server.address() as AddressInfo).port
          const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}`
          if (!options.publicUrl) fake.publicUrl = url
          resolve({ port, url })
        })
      })
    },
    close() {
      webhooks.close()
      return new Promise((resolve, reject) => {
        if (!server.listening) return resolve()
        server.close((err) => (err ? reject(err) : resolve()))
        server.closeAllConnections()
      })
    },
  }
}

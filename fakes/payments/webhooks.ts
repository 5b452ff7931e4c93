/**
 * Webhook delivery: signed POSTs of events to the configured URL, retried with back-off as the real service
 * retries on a non-2xx answer or a timeout, and every attempt recorded for the control routes.
 */
import { createHmac } from 'node:crypto'
import type { DeliveryAttempt, FakeState } from './store'
import type { StripeEvent } from './types'

/** A replay made on purpose with a signature the receiver must refuse. */
export type Tamper = 'invalid' | 'stale'

/** `t=<unix seconds>,v1=<hex HMAC-SHA256>` keyed by the whole whsec_ secret over "<t>.<body>" (observed SDK behaviour). */
export function signatureHeader(payload: string, secret: string, timestamp: number): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex')
  return `t=${timestamp},v1=${v1}`
}

export class WebhookSender {
  private readonly timers = new Set<NodeJS.Timeout>()
  private readonly inflight = new Set<AbortController>()
  /** Bumped by a reset, so retries scheduled before it give up. */
  private generation = 0
  private closed = false

  constructor(private readonly state: FakeState) {}

  /**
   * Delivers an event: the first attempt is awaited by the caller, later attempts back off exponentially in
   * the background up to `webhookMaxAttempts`. Replays with a deliberately bad signature are sent once.
   */
  async deliver(event: StripeEvent, tamper?: Tamper): Promise<DeliveryAttempt | null> {
    const { webhookUrl, enabledEvents } = this.state.config
    if (!webhookUrl) return null
    if (!enabledEvents.includes('*') && !enabledEvents.includes(event.type)) return null
    const generation = this.generation
    const first = await this.attempt(event, 1, tamper)
    if (!first.ok && !tamper) this.retry(event, 2, generation)
    return first
  }

  /** Drops pending retries and aborts attempts in flight (a reset of the fake). */
  cancel(): void {
    this.generation += 1
    for (const t of this.timers) clearTimeout(t)
    this.timers.clear()
    for (const c of this.inflight) c.abort(new Error('reset'))
  }

  close(): void {
    this.closed = true
    this.cancel()
  }

  private retry(event: StripeEvent, n: number, generation: number): void {
    const config = this.state.config
    if (n > config.webhookMaxAttempts || generation !== this.generation || this.closed) return
    const timer = setTimeout(() => {
      this.timers.delete(timer)
      if (generation !== this.generation || this.closed || !this.state.config.webhookUrl) return
      void this.attempt(event, n).then((r) => { if (!r.ok) this.retry(event, n + 1, generation) })
    }, config.webhookRetryBaseMs * 2 ** (n - 2))
    this.timers.add(timer)
  }

  private async attempt(event: StripeEvent, n: number, tamper?: Tamper): Promise<DeliveryAttempt> {
    const { webhookUrl, webhookSecret, webhookTimeoutMs } = this.state.config
    const url = webhookUrl as string
    const payload = JSON.stringify(event, null, 2)
    // The signature uses the real clock, not the fake one, so receivers' tolerance checks still pass.
    const realNow = Math.floor(Date.now() / 1000)
    const header = signatureHeader(
      payload,
      tamper === 'invalid' ? `${webhookSecret}_wrong` : webhookSecret,
      tamper === 'stale' ? realNow - 3600 : realNow,
    )
    const record: DeliveryAttempt = {
      eventId: event.id, attempt: n, at: new Date().toISOString(), url, status: null, ok: false, ...(tamper ? { tampered: tamper } : {}),
    }
    const controller = new AbortController()
    this.inflight.add(controller)
    const timeout = setTimeout(() => controller.abort(new Error('timeout')), webhookTimeoutMs)
    try {
      const res = await fetch(url, {
        method: 'POST',
        headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': header, 'user-agent': 'boreline-payments-fake/1' },
        body: payload,
        signal: controller.signal,
      })
      await res.arrayBuffer().catch(() => undefined)
      record.status = res.status
      record.ok = res.status >= 200 && res.status < 300
    } catch (e) {
      record.error = controller.signal.aborted ? 'timeout' : e instanceof Error ? e.message : String(e)
    } finally {
      clearTimeout(timeout)
      this.inflight.delete(controller)
    }
    this.state.deliveries.push(record)
    return record
  }
}

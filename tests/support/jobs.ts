/**
 * Helpers for the job tests: a quote with parts from the catalogue (and guide labour), sent to the owner and
 * decided through the owner's link (some lines approved, one declined), ready for its job card.
 */
import { Client, type Res } from './api'
import { sendAndReadLink, startQuote } from './quotes'

export interface Line { id: number; kind: string; sku: string | null; quantity: number; hours: number | null; recommendation: string | null; description: string; guideHours?: number | null; labourOperation?: string | null }

export function ok(r: Res, status = 200): Res {
  if (r.status !== status) throw new Error(`expected ${status}, got ${r.status}: ${r.text}`)
  return r
}

/**
 * A quote for `vehicleId` with the part lines given (advised, so the owner may decline without signing) and a
 * labour line, sent and decided: every line approved except the SKUs in `decline`.
 */
export async function decidedQuote(manager: Client, vehicleId: number, skus: string[], decline: string[] = [], extra: Record<string, unknown> = {}) {
  const { quote, ownerEmail } = await startQuote(manager, { vehicleId, ...extra })
  for (const sku of skus) ok(await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku, recommendation: 'advised' }), 201)
  ok(await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'labour', description: 'Fit and test', hours: 1.5, recommendation: 'advised' }), 201)
  const { token } = await sendAndReadLink(manager, quote.id, ownerEmail)
  const anon = new Client()
  const view = ok(await anon.get(`/api/quote-links/${token}`)).body
  const skuOf = new Map((ok(await manager.get(`/api/quotes/${quote.id}`)).body.lines as Line[]).map((l) => [l.id, l.sku]))
  const lines = view.lines.filter((l: { decidable: boolean }) => l.decidable)
    .map((l: { id: number }) => ({ id: l.id, approved: !decline.includes(skuOf.get(l.id) ?? '') }))
  ok(await anon.post(`/api/quote-links/${token}/decision`, { lines, signedName: 'Robin Tester' }))
  return { quoteId: quote.id as number, ownerEmail }
}

export const ALL_CHECKS = ['pedal', 'fluid_level', 'wheel_fixings', 'bedding_in', 'road_test']

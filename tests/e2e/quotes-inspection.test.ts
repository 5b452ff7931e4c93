/**
 * From an inspection to a quote: a fail verdict becomes a required line, an advise verdict an advised line,
 * each with the catalogue part that fits the vehicle and the finding as its reason; the findings are copied
 * onto the quote in plain words for the owner.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { computeWear, type WearInputRaw } from '#shared/utils/brake'
import { plainFinding } from '#shared/utils/quote-wording'
import { Client, as, env, people } from '../support/api'
import { VEHICLE_ID, ownerEmail } from '../support/quotes'

await setup({ host: env().baseUrl })

// front disc under its minimum (fail), fluid with some water (advise): the vehicle's own limits
const wear: WearInputRaw = {
  discs: [{ position: 'front-left', thicknessReadingsMm: [22.4, 22.5, 22.45], minThicknessMm: 23 }],
  fluid: { gradeInSystem: 'DOT 4', waterPercent: 2.5 },
}

let tech: Client, other: Client
let inspection: { id: number; recommendedParts: { axle: string; partType: string; verdict: 'advise' | 'fail'; parts: { sku: string; condition: string | null }[] }[] }

beforeAll(async () => {
  ;[tech, other] = await Promise.all([as(people.technician), as(people.otherManager)])
  const r = await tech.post('/api/inspections', { vehicleId: VEHICLE_ID, registration: 'IN55 PEC', odometer: '77 000 mi', wear })
  expect(r.status, r.text).toBe(201)
  inspection = r.body
})

describe('a quote drafted from an inspection', () => {
  it('turns fail verdicts into required lines and advise verdicts into advised ones', async () => {
    const result = computeWear(wear)
    expect(result.recommendedParts.some((p) => p.verdict === 'fail')).toBe(true)
    expect(result.recommendedParts.some((p) => p.verdict === 'advise')).toBe(true)
    const r = await tech.post('/api/quotes', { vehicleId: VEHICLE_ID, ownerName: 'Ines Quill', ownerEmail: ownerEmail(), inspectionId: inspection.id })
    expect(r.status, r.text).toBe(201)
    expect(r.body).toMatchObject({ inspectionId: inspection.id, registration: 'IN55 PEC', odometer: '77 000 mi' })
    const parts = r.body.lines.filter((l: { kind: string }) => l.kind === 'part')
    for (const rec of inspection.recommendedParts) {
      const pick = rec.parts.find((p) => p.condition === null) ?? rec.parts[0]
      if (!pick) continue
      const line = parts.find((l: { sku: string }) => l.sku === pick.sku)
      expect(line, `${rec.axle} ${rec.partType}`).toBeTruthy()
      expect(line.recommendation).toBe(rec.verdict === 'fail' ? 'required' : 'advised')
      expect(line.reason).toBeTruthy()
    }
    expect(parts.length).toBeGreaterThanOrEqual(2)
    // findings in plain words, the failures first
    expect(r.body.findings[0].verdict).toBe('fail')
    expect(r.body.findings.map((f: { text: string }) => f.text)).toEqual(expect.arrayContaining(result.items.filter((i) => i.verdict === 'fail').map(plainFinding)))
    expect(r.body.findings[0].text).toMatch(/front left brake disc has worn thinner than its safe minimum \(22\.4 mm; the minimum is 23 mm\)/)
  })

  it('adds the recommendations to an existing quote, skipping parts already on it', async () => {
    const q = await tech.post('/api/quotes', { vehicleId: VEHICLE_ID, ownerName: 'Ines Quill', ownerEmail: ownerEmail() })
    const first = await tech.post(`/api/quotes/${q.body.id}/lines/from-inspection`, { inspectionId: inspection.id })
    expect(first.status, first.text).toBe(200)
    expect(first.body.added).toBeGreaterThanOrEqual(2)
    const again = await tech.post(`/api/quotes/${q.body.id}/lines/from-inspection`, {})
    expect(again.body.added).toBe(0)
    expect(again.body.skipped.every((s: { why: string }) => /already on the quote/.test(s.why))).toBe(true)
    expect(again.body.lines).toHaveLength(first.body.lines.length)
  })

  it('refuses another garage\'s inspection, and an inspection of another vehicle', async () => {
    const r = await other.post('/api/quotes', { vehicleId: VEHICLE_ID, ownerName: 'X', ownerEmail: ownerEmail(), inspectionId: inspection.id })
    expect(r.status).toBe(422)
    expect(r.body.data.fields.inspectionId).toMatch(/No such inspection/)
    const wrongVehicle = await tech.post('/api/quotes', { vehicleId: VEHICLE_ID + 1, ownerName: 'X', ownerEmail: ownerEmail(), inspectionId: inspection.id })
    expect(wrongVehicle.status).toBe(422)
    expect(wrongVehicle.body.data.fields.inspectionId).toMatch(/another vehicle/)
  })
})

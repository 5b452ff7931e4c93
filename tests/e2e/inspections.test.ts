/**
 * The inspection a workshop does, wheel by wheel, with its photos: recorded through POST /api/inspections, photos
 * added through POST /api/inspections/:id/photos (type from the bytes, metadata dropped), read by the garage and
 * through the owner's link of a quote drafted from it, and by no one else. Verdicts worked by hand below, each
 * limit's source named.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { VEHICLE_ID, getFrom, ownerEmail, sendAndReadLink } from '../support/quotes'
import { jpegWithGps, pngPhoto } from '../support/images'

await setup({ host: env().baseUrl })

/*
 * The readings and their verdicts, worked by hand:
 *  - front left disc 22.4 / 22.5 mm against its 23 mm discard thickness: under it, fail (COMAR 11.19.03.05 C: never
 *    below the stamped minimum); thickness variation 0.1 mm over the 0.020 mm default: advise (common practice);
 *  - front right disc 24.4 / 24.42 mm: 1.4 mm above the minimum, more than the 1 mm kept when the pads are due: ok;
 *    variation 0.02 mm: within; runout 0.09 mm over the 0.05 mm default: advise (clean the hub, re-check);
 *  - front left pads: inner 1.2 mm under 1.5 mm, a UK roadworthiness-test failure: fail; inner and outer 3.3 mm
 *    apart (over 2 mm, common practice): advise; against the front right's 6 mm, 4.8 mm apart: advise;
 *  - front left hose seen perished: advise; parking brake sound;
 *  - fluid DOT 4 boiling at 150 °C, at or below its 155 °C wet minimum (FMVSS No. 116): fail; 40 months old: advise;
 *  - brake tester, 1300 kg (12 748.6 N): service (2100 + 3100 + 1300 + 1250) / 12 748.6 = 60.8 %, at least 50 %;
 *    front (3100 − 2100) / 3100 = 32.3 %, over 30 %: fail on the front left (MOT Inspection Manual §3.8 formulas).
 */
const wear = {
  discs: [
    { position: 'front-left', thicknessReadingsMm: [22.4, 22.5], minThicknessMm: 23 },
    { position: 'front-right', thicknessReadingsMm: [24.4, 24.42], minThicknessMm: 23, runoutMm: 0.09 },
  ],
  pads: [{ axle: 'front', side: 'left', innerMm: 1.2, outerMm: 4.5 }, { axle: 'front', side: 'right', innerMm: 6, outerMm: 6.5 }],
  conditions: [{ position: 'front-left', item: 'hose', state: 'advise', note: 'perished at the crimp' }, { position: 'system', item: 'parking-brake', state: 'ok' }],
  fluid: { gradeInSystem: 'DOT 4', boilingPointC: 150, ageMonths: 40 },
  brakeTest: {
    massKg: 1300,
    readings: [
      { wheel: 'front_left', serviceN: 2100 }, { wheel: 'front_right', serviceN: 3100 },
      { wheel: 'rear_left', serviceN: 1300, parkingN: 1050 }, { wheel: 'rear_right', serviceN: 1250, parkingN: 1000 },
    ],
  },
}
const VERDICTS: Record<string, string> = {
  'disc:front-left:thickness': 'fail', 'disc:front-left:thickness-variation': 'advise',
  'disc:front-right:thickness': 'ok', 'disc:front-right:thickness-variation': 'ok', 'disc:front-right:runout': 'advise',
  'pad:front:left:inner': 'fail', 'pad:front:left:outer': 'ok', 'pad:front:left:uneven': 'advise',
  'pad:front:right:inner': 'ok', 'pad:front:right:outer': 'ok', 'pad:front:sides': 'advise',
  'condition:front-left:hose': 'advise', 'condition:system:parking-brake': 'ok',
  'fluid:boiling-point': 'fail', 'fluid:age': 'advise',
  'brake-test:service-efficiency': 'ok', 'brake-test:parking-efficiency': 'ok', 'brake-test:imbalance-front': 'fail', 'brake-test:imbalance-rear': 'ok',
}

let tech: Client, manager: Client, otherTech: Client, counter: Client, anon: Client
let inspection: { id: number; result: { items: { id: string; verdict: string; message: string; position: string | null }[] }; recommendedParts: { axle: string; side: string | null; partType: string; verdict: string }[] }

function photoForm(file: Buffer | null, fields: Record<string, string>, type = 'image/png', name = 'photo.png'): FormData {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) form.append(k, v)
  if (file) form.append('photo', new Blob([new Uint8Array(file)], { type }), name)
  return form
}
const upload = (c: Client, id: number, form: FormData) => c.request(`/api/inspections/${id}/photos`, { method: 'POST', body: form })
const bytes = async (c: Client, path: string) => {
  const res = await fetch(new URL(path, env().baseUrl), { headers: c.cookies.size ? { cookie: c.cookieHeader() } : {} })
  return { status: res.status, headers: res.headers, body: Buffer.from(await res.arrayBuffer()) }
}

beforeAll(async () => {
  ;[tech, manager, otherTech, counter] = await Promise.all([as(people.technician), as(people.manager), as(people.otherTechnician), as(people.counter)])
  anon = new Client()
  const r = await tech.post('/api/inspections', { vehicleId: VEHICLE_ID, registration: 'WH33 LSX', odometer: '58 400 mi', wear })
  expect(r.status, r.text).toBe(201)
  inspection = r.body
})

describe('a full inspection, wheel by wheel', () => {
  it('gives the hand-worked verdicts, each naming its wheel', () => {
    expect(Object.fromEntries(inspection.result.items.map((i) => [i.id, i.verdict]))).toEqual(VERDICTS)
    const byId = new Map(inspection.result.items.map((i) => [i.id, i]))
    expect(byId.get('disc:front-left:thickness')!.message).toMatch(/^Front left disc: /)
    expect(byId.get('condition:front-left:hose')!.message).toMatch(/^Front left brake hose: .*\(perished at the crimp\)/)
    expect(byId.get('brake-test:imbalance-front')!).toMatchObject({ position: 'front-left' })
    expect(byId.get('brake-test:imbalance-front')!.message).toMatch(/^The front left brake gives 2\.10 kN against 3\.10 kN/)
  })

  it('recommends per axle, and per side for a part judged at one wheel', () => {
    expect(inspection.recommendedParts.map((p) => [p.axle, p.side, p.partType, p.verdict])).toEqual([
      ['front', null, 'discs', 'fail'], ['front', null, 'pads', 'fail'], ['front', 'left', 'hoses', 'advise'], ['system', null, 'brake-fluid', 'fail'],
    ])
  })
})

describe('photos of a wheel\'s findings', () => {
  let discPhoto: { id: number; url: string }
  let hosePhoto: { id: number; url: string }

  it('a technician adds a photo; the location text in the file does not survive', async () => {
    const r = await upload(tech, inspection.id, photoForm(pngPhoto(), { position: 'front-left', subject: 'disc', caption: 'Lip at the edge' }))
    expect(r.status, r.text).toBe(201)
    expect(r.body).toMatchObject({ position: 'front-left', subject: 'disc', caption: 'Lip at the edge', url: `/api/inspections/${inspection.id}/photos/${r.body.id}` })
    discPhoto = r.body
    const got = await bytes(tech, discPhoto.url)
    expect(got.status).toBe(200)
    expect(got.headers.get('content-type')).toBe('image/png')
    expect(got.headers.get('x-content-type-options')).toBe('nosniff')
    expect(got.headers.get('content-security-policy')).toMatch(/sandbox/)
    expect(got.body.subarray(1, 4).toString('latin1')).toBe('PNG')
    expect(got.body.includes(Buffer.from('Location'))).toBe(false)
    // a camera's JPEG sent as it is loses its Exif GPS position too
    const jpeg = await upload(tech, inspection.id, photoForm(jpegWithGps(), { position: 'front-left', subject: 'hose' }, 'image/jpeg', 'IMG_0001.JPG'))
    expect(jpeg.status, jpeg.text).toBe(201)
    hosePhoto = jpeg.body
    const stored = await bytes(manager, hosePhoto.url)
    expect(stored.headers.get('content-type')).toBe('image/jpeg')
    expect(stored.body.includes(Buffer.from('GPSLatitude'))).toBe(false)
  })

  it('the inspection lists its photos', async () => {
    const r = await manager.get(`/api/inspections/${inspection.id}`)
    expect(r.body.photos.map((p: { id: number }) => p.id)).toEqual([discPhoto.id, hosePhoto.id])
  })

  it('refuses what is not a photo, a missing file and a wheel it does not know, naming the field; nothing is stored', async () => {
    const text = await upload(tech, inspection.id, photoForm(Buffer.from('<script>alert(1)</script>'), { position: 'front-left', subject: 'disc' }, 'image/jpeg', 'photo.jpg'))
    expect(text.status).toBe(415)
    expect(text.body.data.fields.photo).toMatch(/JPEG or PNG/)
    const none = await upload(tech, inspection.id, photoForm(null, { position: 'front-left', subject: 'disc' }))
    expect(none.status).toBe(422)
    expect(none.body.data.fields.photo).toMatch(/photo/)
    const where = await upload(tech, inspection.id, photoForm(pngPhoto(8, 8), { position: 'spare-wheel', subject: 'disc' }))
    expect(where.status).toBe(422)
    expect(where.body.data.fields.position).toMatch(/wheel/)
    const json = await tech.post(`/api/inspections/${inspection.id}/photos`, { position: 'front-left' })
    expect(json.status).toBe(415)
    expect((await tech.get(`/api/inspections/${inspection.id}`)).body.photos).toHaveLength(2)
  })

  it('another garage gets 404, distributor staff 403, a signed-out caller 401', async () => {
    expect((await bytes(otherTech, discPhoto.url)).status).toBe(404)
    expect((await upload(otherTech, inspection.id, photoForm(pngPhoto(8, 8), { position: 'front-left', subject: 'disc' }))).status).toBe(404)
    expect((await otherTech.del(discPhoto.url)).status).toBe(404)
    expect((await bytes(counter, discPhoto.url)).status).toBe(403)
    expect((await bytes(anon, discPhoto.url)).status).toBe(401)
    expect((await upload(anon, inspection.id, photoForm(pngPhoto(8, 8), { position: 'front-left', subject: 'disc' }))).status).toBe(401)
  })

  it('the owner sees each photo beside the line it explains, through the link only', async () => {
    const email = ownerEmail()
    const q = await tech.post('/api/quotes', { vehicleId: VEHICLE_ID, ownerName: 'Nell Harrow', ownerEmail: email, inspectionId: inspection.id })
    expect(q.status, q.text).toBe(201)
    const { token } = await sendAndReadLink(manager, q.body.id, email)
    const view = await anon.get(`/api/quote-links/${token}`)
    expect(view.status).toBe(200)
    type Line = { description: string; reason: string | null; photos: { id: number; where: string; caption: string }[] }
    const lines = view.body.lines as Line[]
    const disc = lines.find((l) => l.photos.some((p) => p.id === discPhoto.id))!
    expect(disc.reason).toMatch(/front left brake disc has worn thinner/)
    expect(disc.photos).toContainEqual({ id: discPhoto.id, where: 'Front left', caption: 'Lip at the edge' })
    const hose = lines.find((l) => l.photos.some((p) => p.id === hosePhoto.id))!
    expect(hose.reason).toMatch(/front left brake hose/)
    const got = await bytes(anon, `/api/quote-links/${token}/photos/${discPhoto.id}`)
    expect(got.status).toBe(200)
    expect(got.headers.get('x-content-type-options')).toBe('nosniff')
    expect(got.headers.get('cache-control')).toMatch(/no-store/)
    // a photo of another inspection, or a link that is not valid: the plain 404
    const mine = await tech.post('/api/inspections', { vehicleId: VEHICLE_ID, wear: { pads: [{ axle: 'rear', innerMm: 2, outerMm: 2 }] } })
    const elsewhere = await upload(tech, mine.body.id, photoForm(pngPhoto(8, 8), { position: 'rear-left', subject: 'pads' }))
    expect((await bytes(anon, `/api/quote-links/${token}/photos/${elsewhere.body.id}`)).status).toBe(404)
    // a wrong link counts against the address it comes from: sent from another loopback address
    expect((await getFrom('127.0.0.7', `/api/quote-links/${'x'.repeat(43)}/photos/${discPhoto.id}`)).status).toBe(404)
  })

  it('a photo taken in error can be removed', async () => {
    const r = await manager.del(hosePhoto.url)
    expect(r.status).toBe(204)
    expect((await bytes(tech, hosePhoto.url)).status).toBe(404)
    expect((await tech.get(`/api/inspections/${inspection.id}`)).body.photos.map((p: { id: number }) => p.id)).toEqual([discPhoto.id])
  })
})

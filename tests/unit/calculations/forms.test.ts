/**
 * The glue around the brake library: form state -> request body, field paths -> form fields, the library's
 * issues -> 422 `data.fields`, and qualifier conditions. The numbers themselves are checked in tests/unit/brake.
 */
import { describe, expect, it } from 'vitest'
import { computeHydraulics, parseHydraulicsInput, parseWearInput } from '#shared/utils/brake'
import { formFromDraft, hydraulicsBody } from '~/utils/boreCheckForm'
import { formErrors, inspectionForm, wearBody, withNewLimits } from '~/utils/inspectionForm'
import { fieldMessages } from '../../../shared/utils/field-messages'
import { qualifierCondition } from '../../../server/services/inspections'

const draft = {
  pedalForceN: 300, pedalRatio: 3.6, boosterRatio: 6, split: 'front-rear', massKg: 1958,
  masterCylinder: { boreMm: 22.22, strokeMm: 34, tandem: true },
  axles: {
    front: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [48, 48], discDiameterMm: 300, frictionCoefficient: 0.4, tyreSize: '215/65 R16C' },
    rear: { kind: 'drum', wheelCylinderBoreMm: 22.22, drumDiameterMm: 254, brakeFactor: 2, tyreSize: '215/65 R16C' },
  },
  replacement: { masterCylinder: { boreMm: 25.4, tandem: true, ports: 2 } },
}

describe('bore-check form', () => {
  it('round-trips a prefill body into the same computation', () => {
    const form = formFromDraft(draft)
    expect(form.replace).toEqual({ masterCylinder: true, front: false, rear: false })
    const body = hydraulicsBody(form)
    expect(computeHydraulics(body)).toEqual(computeHydraulics(draft as never))
  })

  it('round-trips the vehicle, booster knee, pad and shoe data', () => {
    const full = {
      ...draft, massKg: undefined, boosterRunOutKPa: 11000, tyreRoadFriction: 0.7,
      vehicle: { massKg: 1958, wheelbaseMm: 3100, cogHeightMm: 700, frontStaticSharePercent: 60, laden: { massKg: 2958, cogHeightMm: 780, frontStaticSharePercent: 46 }, rearValve: { kneeKPa: 2500, slope: 0.3, ladenKneeKPa: 5500 }, electronicDistribution: true },
      axles: {
        front: { ...draft.axles.front, padHeightMm: 64, edgeMarginMm: 2 },
        rear: { kind: 'drum', wheelCylinderBoreMm: 22.22, drumDiameterMm: 254, shoeLayout: 'leading-trailing', tyreSize: '215/65 R16C' },
      },
    }
    const body = hydraulicsBody(formFromDraft(full))
    expect(body).toMatchObject({ boosterRunOutKPa: 11000, tyreRoadFriction: 0.7, vehicle: full.vehicle })
    expect(body.massKg).toBeUndefined()
    expect(computeHydraulics(body)).toEqual(computeHydraulics(full as never))
  })

  it('with only a mass, sends the mass; with part of the geometry, the vehicle so the schema names what is missing', () => {
    const form = formFromDraft(draft)
    expect(hydraulicsBody(form)).toMatchObject({ massKg: 1958 })
    form.vehicle.wheelbaseMm = 3100
    const r = parseHydraulicsInput(JSON.parse(JSON.stringify(hydraulicsBody(form))))
    const fields = fieldMessages(r.ok ? [] : r.issues)
    expect(fields['vehicle.cogHeightMm']).toMatch(/required/)
    expect(fields['vehicle.frontStaticSharePercent']).toMatch(/required/)
  })

  it('drops blanks so the schema names what is missing, and keeps unreadable numbers as errors', () => {
    const form = formFromDraft(draft)
    form.masterCylinder.boreMm = null
    form.axles.front.frictionCoefficient = Number.NaN
    form.axles.front.pistonDiametersMm = [48, null]
    const r = parseHydraulicsInput(JSON.parse(JSON.stringify(hydraulicsBody(form))))
    expect(r.ok).toBe(false)
    const fields = fieldMessages(r.ok ? [] : r.issues)
    expect(fields['masterCylinder.boreMm']).toMatch(/required/)
    expect(fields['axles.front.frictionCoefficient']).toMatch(/number/)
    expect(fields['axles.front.pistonDiametersMm[1]']).toMatch(/number/)
  })

  it('sends the pedal force of the chart sweep when asked', () => {
    expect(hydraulicsBody(formFromDraft(draft), 125).pedalForceN).toBe(125)
  })
})

describe('inspection form, wheel by wheel', () => {
  const limits = {
    front: { kind: 'disc' as const, discDiameterMm: 280, discThicknessMm: 25, discMinThicknessMm: 23, maxRunoutMm: 0.05, maxThicknessVariationMm: 0.015, drumDiameterMm: null, drumMaxDiameterMm: null },
    rear: { kind: 'drum' as const, discDiameterMm: null, discThicknessMm: null, discMinThicknessMm: null, maxRunoutMm: 0.1, maxThicknessVariationMm: null, drumDiameterMm: 228.6, drumMaxDiameterMm: 230.1 },
    specifiedGrade: 'DOT 4',
  }

  it('sends only what was measured, per wheel, with the vehicle limits', () => {
    const f = inspectionForm(limits, 1300)
    f.wheels['front-left'].readings = [null, 22.9, null, 23.05]
    f.wheels['front-left'].tv = 0.03
    f.wheels['front-left'].padInner = 2
    f.wheels['front-left'].padOuter = 3.5
    f.wheels['front-right'].conditions.hose = { state: 'advise', note: ' perished ' }
    f.wheels['rear-right'].drumDiameter = 230.4
    f.wheels['rear-right'].lining = 2.5
    f.parkingBrake.state = 'ok'
    f.fluid.waterPercent = 2.5
    f.fluid.ageMonths = 30
    f.brakeTest.service['front-left'] = 3000
    f.brakeTest.service['front-right'] = 2900
    const { body } = wearBody(f)
    expect(body).toEqual({
      discs: [{ position: 'front-left', thicknessReadingsMm: [22.9, 23.05], minThicknessMm: 23, thicknessVariationMm: 0.03, runoutLimitMm: 0.05, thicknessVariationLimitMm: 0.015 }],
      pads: [{ axle: 'front', side: 'left', innerMm: 2, outerMm: 3.5 }],
      drums: [{ position: 'rear-right', diameterMm: 230.4, maxDiameterMm: 230.1 }],
      shoes: [{ position: 'rear-right', liningMm: 2.5 }],
      conditions: [{ position: 'front-right', item: 'hose', state: 'advise', note: 'perished' }, { position: 'system', item: 'parking-brake', state: 'ok' }],
      fluid: { waterPercent: 2.5, ageMonths: 30, gradeInSystem: 'DOT 4', specifiedGrade: 'DOT 4' },
      brakeTest: { massKg: 1300, readings: [{ wheel: 'front_left', serviceN: 3000 }, { wheel: 'front_right', serviceN: 2900 }] },
    })
    expect(parseWearInput(body).ok).toBe(true)
  })

  it('puts each message next to the field it is about, wherever the readings sit in the body', () => {
    const f = inspectionForm(limits)
    f.wheels['front-right'].readings = [null, null, -1, null]
    f.axles.front.minThicknessMm = null
    f.wheels['front-left'].tv = 9
    f.brakeTest.service['rear-left'] = 2000
    const { body, paths } = wearBody(f)
    const r = parseWearInput(body)
    expect(r.ok).toBe(false)
    const errors = formErrors(Object.fromEntries((r.ok ? [] : r.issues).map((i) => [i.field, i.message])), paths)
    expect(errors['front-right.reading.2']).toMatch(/greater than 0/)
    expect(errors['front.minThickness']).toMatch(/required/)
    expect(errors['front-left.disc']).toMatch(/at least one/) // a variation given without any reading
    expect(errors['front-left.tv']).toMatch(/at most 5/)
    expect(errors['brakeTest.mass']).toMatch(/required/)
    // the same messages from POST /api/inspections carry a "wear." prefix; others pass through
    const server = formErrors({ 'wear.discs[0].minThicknessMm': 'x', registration: 'too long', 'answers.rear_brake': 'no' }, paths)
    expect(server).toEqual({ 'front.minThickness': 'x', registration: 'too long', 'answers.rear_brake': 'no' })
    expect(formErrors({ wear: 'nothing to check' }, paths)).toEqual({ _: 'nothing to check' })
  })

  it('keeps the readings when an option answer brings new limits', () => {
    const f = inspectionForm(limits)
    f.wheels['front-left'].readings[0] = 22.4
    f.registration = 'MB19 KTR'
    const next = withNewLimits(f, { ...limits, front: { ...limits.front, discMinThicknessMm: 26 }, rear: { ...limits.front } })
    expect(next.wheels['front-left'].readings[0]).toBe(22.4)
    expect(next.axles.front.minThicknessMm).toBe(26)
    expect(next.axles.rear.kind).toBe('disc') // kind changed: that axle's wheels start blank
    expect(next.wheels['rear-left'].drumDiameter).toBeNull()
    expect(next.registration).toBe('MB19 KTR')
  })
})

describe('422 fields from the library issues', () => {
  it('keys them by field path, first message wins, the whole body under _', () => {
    expect(fieldMessages([
      { field: 'axles.front.frictionCoefficient', message: 'a' },
      { field: 'axles.front.frictionCoefficient', message: 'b' },
      { field: '(body)', message: 'nothing to check' },
    ])).toEqual({ 'axles.front.frictionCoefficient': 'a', _: 'nothing to check' })
    expect(fieldMessages([{ field: 'discs[0].minThicknessMm', message: 'm' }, { field: '(body)', message: 'n' }], 'wear'))
      .toEqual({ 'wear.discs[0].minThicknessMm': 'm', wear: 'n' })
  })
})

describe('qualifier conditions', () => {
  const options = [{ key: 'front_disc_diameter_mm', label: 'Front disc diameter', values: [{ value: '280', label: '280 mm' }, { value: '300', label: '300 mm' }] }]
  it('excludes a different answer, spells out an open one, and is silent when all is answered', () => {
    expect(qualifierCondition({ front_disc_diameter_mm: '300' }, { front_disc_diameter_mm: '280' }, options)).toEqual({ fits: false, condition: null })
    expect(qualifierCondition({ front_disc_diameter_mm: '300' }, {}, options)).toEqual({ fits: true, condition: 'if Front disc diameter is 300 mm' })
    expect(qualifierCondition({ front_disc_diameter_mm: '300' }, { front_disc_diameter_mm: '300.0' }, options)).toEqual({ fits: true, condition: null })
    expect(qualifierCondition({}, {}, options)).toEqual({ fits: true, condition: null })
  })
})

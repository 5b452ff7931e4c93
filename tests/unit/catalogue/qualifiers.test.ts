import { describe, expect, it } from 'vitest'
import { answerProblems, canonicalAnswers, matchQualifiers, openQuestions, sameValue } from '#shared/utils/catalogue/qualifiers'

const options = [
  { key: 'front_disc_diameter_mm', label: 'Front disc diameter', question: '280 or 300 mm?', values: [{ value: '280', label: '280 mm' }, { value: '300', label: '300 mm' }] },
  { key: 'parking_brake', label: 'Parking brake', question: 'Electric or cable?', values: [{ value: 'cable', label: 'Cable' }, { value: 'electric', label: 'Electric' }] },
  { key: 'rear_brake', label: 'Rear brakes', question: 'Disc or drum?', values: [{ value: 'disc', label: 'Disc' }, { value: 'drum', label: 'Drum' }] },
]
const fitments = [
  { qualifiers: {} }, // hoses: always
  { qualifiers: { front_disc_diameter_mm: '280' } },
  { qualifiers: { front_disc_diameter_mm: '280' } },
  { qualifiers: { front_disc_diameter_mm: '300' } },
  { qualifiers: { parking_brake: 'electric' } },
  { qualifiers: { parking_brake: 'cable' } },
]

describe('qualifier matching', () => {
  it('keeps a fitment while its qualifiers are unanswered or answered the same way', () => {
    expect(matchQualifiers({}, {})).toBe('fits')
    expect(matchQualifiers({ front_disc_diameter_mm: '300' }, {})).toBe('open')
    expect(matchQualifiers({ front_disc_diameter_mm: '300' }, { front_disc_diameter_mm: '300' })).toBe('fits')
    expect(matchQualifiers({ front_disc_diameter_mm: '300' }, { front_disc_diameter_mm: '280' })).toBe('excluded')
    expect(matchQualifiers({ front_disc_diameter_mm: '300', parking_brake: 'cable' }, { front_disc_diameter_mm: '300' })).toBe('open')
    expect(matchQualifiers({ front_disc_diameter_mm: '300', parking_brake: 'cable' }, { parking_brake: 'electric' })).toBe('excluded')
  })

  it('compares numbers as numbers and words without regard to case', () => {
    expect(sameValue('300', '300.0')).toBe(true)
    expect(sameValue('300', '280')).toBe(false)
    expect(sameValue('Electric', 'electric')).toBe(true)
    expect(sameValue('', '0')).toBe(false)
  })

  it('names answers the vehicle cannot take', () => {
    expect(answerProblems(options, { front_disc_diameter_mm: '300.0', parking_brake: 'cable' })).toEqual({})
    expect(Object.keys(answerProblems(options, { front_disc_diameter_mm: '290', colour: 'red' }))).toEqual(['opt.front_disc_diameter_mm', 'opt.colour'])
    expect(answerProblems(options, { front_disc_diameter_mm: '290' })['opt.front_disc_diameter_mm']).toMatch(/280, 300/)
    expect(canonicalAnswers(options, { front_disc_diameter_mm: '300.0' })).toEqual({ front_disc_diameter_mm: '300' })
  })

  it('asks only questions some remaining fitment depends on, with how many parts each answer keeps', () => {
    const open = openQuestions(options, fitments, {})
    expect(open.map((q) => q.key)).toEqual(['front_disc_diameter_mm', 'parking_brake']) // nothing depends on rear_brake
    expect(open[0]!.values.map((v) => [v.value, v.count])).toEqual([['280', 5], ['300', 4]])
    const after = openQuestions(options, fitments, { front_disc_diameter_mm: '300' })
    expect(after.map((q) => q.key)).toEqual(['parking_brake'])
    expect(after[0]!.values.map((v) => v.count)).toEqual([3, 3])
    expect(openQuestions(options, fitments, { front_disc_diameter_mm: '300', parking_brake: 'cable' })).toEqual([])
  })
})

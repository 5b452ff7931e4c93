import { describe, expect, it } from 'vitest'
import { answerProblems, canonicalAnswers, matchQualifiers, openQuestions } from '#shared/utils/catalogue/qualifiers'

// fitment breakpoints by VIN pattern and build month (common practice: makers change parts mid-model by VIN
// serial or production date, and parts catalogues qualify fitments so)
const early = { built_to: '2016-02' }
const late = { built_from: '2016-03' }
const plant = { vin: 'WK3VB*D' }
const options = [{ key: 'rear_brake', label: 'Rear brakes', question: 'Disc or drum?', values: [{ value: 'disc', label: 'Disc' }, { value: 'drum', label: 'Drum' }] }]

describe('identity breakpoints on fitments', () => {
  it('narrow by build month, inclusive at both ends', () => {
    expect(matchQualifiers(early, { built: '2015-09' })).toBe('fits')
    expect(matchQualifiers(early, { built: '2016-02' })).toBe('fits')
    expect(matchQualifiers(early, { built: '2016-03' })).toBe('excluded')
    expect(matchQualifiers(late, { built: '2016-03' })).toBe('fits')
    expect(matchQualifiers(late, { built: '2015-09' })).toBe('excluded')
    expect(matchQualifiers({ built_from: '2014-01', built_to: '2016-12' }, { built: '2017-01' })).toBe('excluded')
  })

  it('narrow by VIN pattern', () => {
    expect(matchQualifiers(plant, { vin: 'WK3VB2D18FT104472' })).toBe('fits')
    expect(matchQualifiers(plant, { vin: 'WK3VB2P18FT104472' })).toBe('excluded')
  })

  it('stay open while the car is not identified, and combine with option answers', () => {
    expect(matchQualifiers({ ...late, rear_brake: 'drum' }, {})).toBe('open')
    expect(matchQualifiers({ ...late, rear_brake: 'drum' }, { rear_brake: 'drum' })).toBe('open')
    expect(matchQualifiers({ ...late, rear_brake: 'drum' }, { rear_brake: 'drum', built: '2017-05' })).toBe('fits')
    expect(matchQualifiers({ ...late, rear_brake: 'drum' }, { rear_brake: 'disc', built: '2017-05' })).toBe('excluded')
  })

  it('are checked for shape, never asked as questions', () => {
    expect(answerProblems(options, { vin: 'WK3VB2D18FT104472', built: '2016-03', rear_brake: 'drum' })).toEqual({})
    expect(Object.keys(answerProblems(options, { built: '2016-13', vin: 'WK3VBIO' }))).toEqual(['opt.built', 'opt.vin'])
    expect(answerProblems(options, { built_from: 'March 2016' })['opt.built_from']).toMatch(/year and month/)
    expect(canonicalAnswers(options, { vin: 'wk3vb*d' })).toEqual({ vin: 'WK3VB*D' })
    const fitments = [{ qualifiers: { ...late, rear_brake: 'drum' } }, { qualifiers: { ...early, rear_brake: 'disc' } }]
    // the build month leaves only the late fitment: the rear-brake question stays, with how many parts each answer keeps
    expect(openQuestions(options, fitments, { built: '2017-01' }).map((q) => [q.key, q.values.map((v) => v.count)])).toEqual([['rear_brake', [0, 1]]])
    expect(openQuestions(options, fitments, {}).map((q) => [q.key, q.values.map((v) => v.count)])).toEqual([['rear_brake', [1, 1]]])
  })
})

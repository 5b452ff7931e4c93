import { describe, expect, it } from 'vitest'
import { displayRegistration, normaliseRegistration, registrationAge, registrationProblem, ukRegistrationAge } from '#shared/utils/vehicles/registration'

describe('UK age identifier (DVLA leaflet INF104, "Vehicle registration numbers and number plates")', () => {
  it('reads the current format: the year for March-August, the year + 50 for September-February', () => {
    // INF104: the format began on 1 September 2001 with "51"; "02" from 1 March 2002, "52" from 1 September 2002
    expect(ukRegistrationAge('AB51CDE')).toEqual({ format: 'current', from: '2001-09', to: '2002-02' })
    expect(ukRegistrationAge('AB02CDE')).toEqual({ format: 'current', from: '2002-03', to: '2002-08' })
    expect(ukRegistrationAge('AB52CDE')).toEqual({ format: 'current', from: '2002-09', to: '2003-02' })
    expect(ukRegistrationAge('NG19KTV')).toEqual({ format: 'current', from: '2019-03', to: '2019-08' })
    expect(ukRegistrationAge('LM65WRD')).toEqual({ format: 'current', from: '2015-09', to: '2016-02' })
    expect(ukRegistrationAge('KX70ABC')).toEqual({ format: 'current', from: '2020-09', to: '2021-02' })
    // the last of the scheme: "50" March 2050 was never needed as such; "00" is September 2050 - February 2051
    expect(ukRegistrationAge('AB00CDE')).toEqual({ format: 'current', from: '2050-09', to: '2051-02' })
    expect(ukRegistrationAge('AB01CDE')).toBeNull() // "01" was never issued
  })

  it('reads the prefix format of 1983-2001 (letter years from August, half years from 1998; from memory)', () => {
    expect(ukRegistrationAge('A123BCD')).toEqual({ format: 'prefix', from: '1983-08', to: '1984-07' })
    expect(ukRegistrationAge('R7KLM')).toEqual({ format: 'prefix', from: '1997-08', to: '1998-07' })
    expect(ukRegistrationAge('S55TUV')).toEqual({ format: 'prefix', from: '1998-08', to: '1999-02' })
    expect(ukRegistrationAge('Y999XYZ')).toEqual({ format: 'prefix', from: '2001-03', to: '2001-08' })
  })

  it('reads the suffix format of 1963-1983 (from memory)', () => {
    expect(ukRegistrationAge('ABC123A')).toEqual({ format: 'suffix', from: '1963-01', to: '1963-12' })
    expect(ukRegistrationAge('ABC123Y')).toEqual({ format: 'suffix', from: '1982-08', to: '1983-07' })
  })

  it('tells nothing for marks of other shapes or where no national format is configured', () => {
    expect(ukRegistrationAge('BORE1')).toBeNull()
    expect(ukRegistrationAge('1234AB')).toBeNull()
    expect(registrationAge('lm65 wrd', 'uk')).toEqual({ format: 'current', from: '2015-09', to: '2016-02' })
    expect(registrationAge('LM65WRD', 'none')).toBeNull()
  })
})

describe('registration marks', () => {
  it('are kept without spaces and shown as people write them', () => {
    expect(normaliseRegistration(' lm65 wrd ')).toBe('LM65WRD')
    expect(displayRegistration('LM65WRD')).toBe('LM65 WRD')
    expect(displayRegistration('A123BCD')).toBe('A123 BCD')
    expect(displayRegistration('BORE1')).toBe('BORE1')
  })

  it('refuse what cannot be a mark', () => {
    expect(registrationProblem('LM65WRD')).toBeNull()
    expect(registrationProblem('')).toMatch(/Enter/)
    expect(registrationProblem('LM65-WRD!')).toMatch(/only letters and digits/)
    expect(registrationProblem('ABCDEFGHJ1')).toMatch(/2 to 8/)
    expect(registrationProblem('ABCDEF')).toMatch(/at least one digit/)
  })
})

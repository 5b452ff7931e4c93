/**
 * The owner's words for a catalogue part: the trade detail (the vehicles a part is listed for, pad shape and
 * friction codes, the SKU behind a deposit) stays on the garage's screens. Expected strings written by hand from
 * the seeded descriptions' pattern (server/seed/catalogue-data.ts).
 */
import { describe, expect, it } from 'vitest'
import { ownerPartWords } from '#shared/utils/quote-wording'

describe('ownerPartWords', () => {
  it('drops the friction code and the vehicles the pads are listed for', () => {
    expect(ownerPartWords('part', 'Front pad set 123.5 × 53 × 17.5 mm, with wear sensor, Greywell Street (FF), for Quillan Dray, Quillan Hopper'))
      .toBe('Front pad set 123.5 × 53 × 17.5 mm, with wear sensor, Greywell Street')
  })
  it('drops the pad shape code of a fitting kit', () => {
    expect(ownerPartWords('part', 'Front pad fitting kit (clips, guide pins, boots) for pad shape PS-Q1235-53, for Quillan Dray'))
      .toBe('Front pad fitting kit (clips, guide pins, boots)')
  })
  it('names a deposit without its SKU, and leaves labour and the garage\'s own lines as written', () => {
    expect(ownerPartWords('core_deposit', 'Core deposit for KC-1001R')).toBe('Exchange deposit on the old unit')
    expect(ownerPartWords('labour', 'Fit and test, for the MOT')).toBe('Fit and test, for the MOT')
    expect(ownerPartWords('sundry', 'Disposal (EU)')).toBe('Disposal (EU)')
  })
})

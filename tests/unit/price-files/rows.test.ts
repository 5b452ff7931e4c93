import { describe, expect, it } from 'vitest'
import { create, all as mathAll } from 'mathjs'
import { z } from 'zod'
import { emptyMapping, columnIndex } from '../../../server/services/price-files/mapping'
import { classify, priceChange, rowValidator, type CurrentPart } from '../../../server/services/price-files/rows'
import type { ColumnMapping } from '#shared/types/price-files'

const headers = ['sku', 'description', 'type', 'list_price', 'trade_cost', 'core_deposit', 'pack_quantity', 'stock_NGT']
const mapping: ColumnMapping = {
  ...emptyMapping(), sku: 'sku', description: 'description', type: 'type', listPrice: 'list_price', tradeCost: 'trade_cost',
  coreDeposit: 'core_deposit', packQuantity: 'pack_quantity', stock: { NGT: 'stock_NGT' },
}
const point = rowValidator(mapping, columnIndex(mapping, headers), '.')
const comma = rowValidator(mapping, columnIndex(mapping, headers), ',')
const row = (o: Partial<Record<string, string>>) => headers.map((h) => o[h] ?? '')
const base = { sku: 'kf-pd-1001', description: 'Front pad set', type: 'pad_set', list_price: '48.20', trade_cost: '30.10', core_deposit: '0', pack_quantity: '1', stock_NGT: '12' }

function issues(v: ReturnType<typeof point.validate>) {
  if (v.ok) throw new Error('expected a refusal')
  return v.issues
}

describe('row validation', () => {
  it('accepts a complete row and normalises the SKU', () => {
    const v = point.validate(row(base))
    expect(v).toEqual({
      ok: true,
      values: { sku: 'KF-PD-1001', description: 'Front pad set', type: 'pad_set', listMinor: 4820, tradeMinor: 3010, coreMinor: 0, pack: 1, stock: { NGT: 12 } },
    })
  })

  it('reads decimal commas when the file uses them, and says so when the wrong mark was chosen', () => {
    expect(comma.validate(row({ ...base, list_price: '48,20', trade_cost: '30,1' }))).toMatchObject({ ok: true, values: { listMinor: 4820, tradeMinor: 3010 } })
    expect(issues(point.validate(row({ ...base, list_price: '48,20' })))[0]!.reason).toMatch(/uses a decimal comma.*decimal point/)
  })

  it('refuses missing, zero, negative, three-decimal and currency-marked prices, naming the column', () => {
    const cases: [string, RegExp][] = [['', /List price is missing/], ['0', /more than zero/], ['-4.00', /must be positive/],
      ['4.005', /more than two decimals/], ['£4.00', /leave out the currency/], ['four', /not an amount/]]
    for (const [value, message] of cases) {
      const [i] = issues(point.validate(row({ ...base, list_price: value })))
      expect(i).toMatchObject({ column: 'list_price' })
      expect(i!.reason).toMatch(message)
    }
  })

  it('refuses badly formed SKUs and a non-integer or zero pack quantity', () => {
    expect(issues(point.validate(row({ ...base, sku: '' })))[0]!.reason).toBe('SKU is missing.')
    expect(issues(point.validate(row({ ...base, sku: 'KF PD 1' })))[0]!.reason).toMatch(/not well-formed/)
    expect(issues(point.validate(row({ ...base, pack_quantity: '2.5' })))[0]).toMatchObject({ column: 'pack_quantity' })
    expect(issues(point.validate(row({ ...base, pack_quantity: '0' })))[0]!.reason).toMatch(/whole number from 1/)
    expect(issues(point.validate(row({ ...base, stock_NGT: '-1' })))[0]).toMatchObject({ column: 'stock_NGT' })
  })

  it('refuses formulas in any cell (OWASP CSV injection: = + - @)', () => {
    for (const [col, value] of [['description', '=HYPERLINK("http://x.test","click")'], ['description', '@SUM(A1)'], ['sku', '+KF1'],
      ['description', '-cmd|calc'], ['list_price', '=B2*2']] as const) {
      const [i] = issues(point.validate(row({ ...base, [col]: value })))
      expect(i).toMatchObject({ column: col })
      expect(i!.reason).toMatch(/looks like a spreadsheet formula/)
    }
  })

  it('lists every problem of a row, and an unquoted delimiter that adds cells', () => {
    const two = issues(point.validate(row({ ...base, list_price: 'x', pack_quantity: 'y' })))
    expect(two.map((i) => i.column)).toEqual(['list_price', 'pack_quantity'])
    const wide = issues(point.validate([...row(base), '50']))
    expect(wide[0]!.reason).toMatch(/has 9 cells but the header row has 8/)
  })

  it('treats blank optional cells as "keep the current value"', () => {
    const v = point.validate(row({ sku: 'KF-1', list_price: '5' }))
    expect(v).toEqual({ ok: true, values: { sku: 'KF-1', description: undefined, type: undefined, listMinor: 500, tradeMinor: undefined, coreMinor: undefined, pack: undefined, stock: null } })
  })

  it('accepts the part types of the catalogue in people\'s spelling', () => {
    expect(point.validate(row({ ...base, type: 'Pad set' }))).toMatchObject({ ok: true, values: { type: 'pad_set' } })
    // the message names the types as people write them, never the catalogue's internal keys (pad_set)
    expect(issues(point.validate(row({ ...base, type: 'spoiler' })))[0]!.reason).toBe('Part type “spoiler” is not one of: Pad set, Disc, Drum, '
      + 'Shoe set, Caliper, Wheel cylinder, Master cylinder, Hose, Fluid, Fitting kit, Wear sensor.')
    // and each of those names is accepted as written there
    for (const [name, type] of [['Wheel cylinder', 'wheel_cylinder'], ['Fitting kit', 'fitting_kit'], ['Wear sensor', 'wear_sensor']]) {
      expect(point.validate(row({ ...base, type: name! }))).toMatchObject({ ok: true, values: { type } })
    }
  })

  it('decides each cell as the zod schema it is declared with does (zod as the reference), at the limits too', () => {
    // descriptions: zod's max(300) counts an emoji (a UTF-16 surrogate pair) as one character once the text is
    // longer than 300 UTF-16 units; the formula rule (OWASP) as above
    const descriptions = ['x'.repeat(300), 'x'.repeat(301), '😀'.repeat(150), '😀'.repeat(151), '😀'.repeat(301), `${'😀'.repeat(149)}xx`, '-brake', '-12 mm', '=1+1']
    const description = z.string().max(300).regex(/^(?![=+@\t\r]|-[^\d\s])/)
    for (const d of descriptions) expect(point.validate(row({ ...base, description: d })).ok, d).toBe(description.safeParse(d).success)
    // money: at most 12 digits and two decimals, zero refused for the list price; minor units worked by hand
    const money = z.string().regex(/^(?!0+(?:[.,]0*)?$)\d{1,12}(?:\.\d{1,2})?$/)
    const prices: [string, number | null][] = [['999999999999.99', 99_999_999_999_999], ['1000000000000', null], ['0.5', 50], ['0.05', 5], ['7', 700], ['00.10', 10], ['0.00', null], ['1.', null], ['.5', null]]
    for (const [p, minor] of prices) {
      const v = point.validate(row({ ...base, list_price: p }))
      expect(v.ok, p).toBe(money.safeParse(p).success)
      expect(v.ok ? v.values.listMinor : null, p).toBe(minor)
    }
  })
})

describe('comparison with the price in use', () => {
  const current: CurrentPart = { id: 7, status: 'active', list: 4820, trade: 3010, core: 0, pack: 1 }

  it('new SKUs need a type and a description', () => {
    const v = { sku: 'KF-NEW', listMinor: 1000, stock: null }
    expect(classify(v, undefined, mapping)).toMatchObject({ kind: 'rejected', issue: { reason: /needs a part type and a description/ } })
    expect(classify({ ...v, type: 'disc', description: 'Disc' }, undefined, mapping)).toMatchObject({ kind: 'new', list: 1000, trade: null, core: 0, pack: 1 })
  })

  it('keeps current values for blank cells and finds unchanged rows', () => {
    expect(classify({ sku: 'KF-PD-1001', listMinor: 4820, stock: null }, current, mapping)).toMatchObject({ kind: 'unchanged', trade: 3010, core: 0, pack: 1 })
    expect(classify({ sku: 'KF-PD-1001', listMinor: 4820, pack: 2, stock: null }, current, mapping)).toMatchObject({ kind: 'changed', changePct: 0, large: false })
  })

  it('computes the percent change like an exact fraction calculation (mathjs), flagging beyond +/-30 %', () => {
    // Reference: mathjs fractions, (new - old) / old * 100, rounded to 2 decimals.
    const math = create(mathAll, { number: 'Fraction' })
    const exact = (o: number, n: number) => math.multiply(math.divide(math.fraction(n - o), math.fraction(o)), 100) as unknown as ReturnType<typeof math.fraction>
    for (const [o, n] of [[4820, 6266], [4820, 6267], [1000, 700], [1000, 699], [333, 1000], [12345, 12346], [1, 2]] as const) {
      const c = priceChange(o, n)
      expect(c.changePct).toBeCloseTo(Number(math.round(exact(o, n) as never, 2)), 10)
      expect(c.large).toBe(math.compare(math.abs(exact(o, n)), 30) as unknown as number > 0)
    }
    // exactly 30 % is not "over 30 %"; one minor unit more is (common practice: the threshold is exclusive)
    expect(priceChange(1000, 1300).large).toBe(false)
    expect(priceChange(1000, 1301).large).toBe(true)
    expect(priceChange(1000, 700).large).toBe(false)
    expect(priceChange(1000, 699).large).toBe(true)
    expect(priceChange(null, 500)).toEqual({ changePct: null, large: false })
  })
})

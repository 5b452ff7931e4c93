import { describe, expect, it } from 'vitest'
import { autoMapping, checkMapping, columnIndex, displayHeaders, emptyMapping, savedMappingFits, stockBranchOf } from '../../../server/services/price-files/mapping'

const branches = ['NGT', 'RVS']

describe('headers', () => {
  it('names blank headers by position and numbers repeats', () => {
    expect(displayHeaders([' SKU ', '', 'Price', 'price'])).toEqual(['SKU', '(column 2)', 'Price', 'price (2)'])
  })
})

describe('automatic mapping', () => {
  it('maps the obvious names, whatever their case and punctuation', () => {
    const m = autoMapping(['SKU', 'Description', 'Type', 'List Price', 'trade-cost', 'Core deposit', 'Pack qty', 'stock_NGT', 'Stock RVS'], branches)
    expect(m).toEqual({
      sku: 'SKU', description: 'Description', type: 'Type', listPrice: 'List Price', tradeCost: 'trade-cost',
      coreDeposit: 'Core deposit', packQuantity: 'Pack qty', stock: { NGT: 'stock_NGT', RVS: 'Stock RVS' },
    })
  })

  it('understands a currency suffix and leaves unknown headers alone', () => {
    const m = autoMapping(['Part Ref', 'Retail (GBP)', 'Colour'], branches)
    expect(m.sku).toBe('Part Ref')
    expect(m.listPrice).toBe('Retail (GBP)')
    expect(m.description).toBeNull()
  })

  it('ignores stock columns for branches that do not exist', () => {
    expect(stockBranchOf('stock_XYZ', branches)).toBeNull()
    expect(stockBranchOf('qty-ngt', branches)).toBe('NGT')
    const check = checkMapping(autoMapping(['sku', 'list_price', 'stock_XYZ'], branches), ['sku', 'list_price', 'stock_XYZ'], branches)
    expect(check.notes.join(' ')).toMatch(/stock_XYZ.*no branch/)
  })
})

describe('mapping check', () => {
  it('blocks without a SKU or a list price column and says so per field', () => {
    const headers = ['Artikel', 'Betrag']
    const check = checkMapping(autoMapping(headers, branches), headers, branches)
    expect(check.problems.sku).toMatch(/No column is chosen for the SKU/)
    expect(check.problems.listPrice).toMatch(/list price/)
  })

  it('flags a mapped header the file does not have and a branch that does not exist', () => {
    const m = { ...emptyMapping(), sku: 'sku', listPrice: 'price', stock: { ZZZ: 'sku' } }
    const check = checkMapping(m, ['sku', 'list'], branches)
    expect(check.problems.listPrice).toMatch(/no column “price”/)
    expect(check.problems.stock).toMatch(/no branch with code ZZZ/)
  })

  it('notes what happens to parts without description/type, trade cost, core deposit, pack columns', () => {
    const check = checkMapping({ ...emptyMapping(), sku: 'sku', listPrice: 'list_price' }, ['sku', 'list_price'], branches)
    expect(check.problems).toEqual({})
    expect(check.notes.join(' ')).toMatch(/refused.*keep their current trade cost.*core deposit.*pack quantity/s)
  })

  it('reuses a saved mapping only when every header it names is in the file', () => {
    const saved = { ...emptyMapping(), sku: 'Ref', listPrice: 'Retail', stock: { NGT: 'On hand N' } }
    expect(savedMappingFits(saved, ['Ref', 'Retail', 'On hand N', 'extra'])).toBe(true)
    expect(savedMappingFits(saved, ['Ref', 'Retail'])).toBe(false)
  })

  it('turns a mapping into column positions', () => {
    const idx = columnIndex({ ...emptyMapping(), sku: 'b', listPrice: 'a', stock: { NGT: 'c' } }, ['a', 'b', 'c'])
    expect(idx).toEqual({ fields: { sku: 1, listPrice: 0 }, stock: [['NGT', 2]], width: 3 })
  })
})

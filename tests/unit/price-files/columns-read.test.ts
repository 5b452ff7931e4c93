import { describe, expect, it } from 'vitest'
import { columnsReadText } from '#shared/utils/price-files/columns-read'

describe('the sentence naming the columns in use', () => {
  it('names every column in use, stock branch by branch, and leaves out what the file does not have', () => {
    const text = columnsReadText({
      sku: 'Part ref', description: 'Info', type: null, listPrice: 'Sell each', tradeCost: 'Our cost', coreDeposit: null,
      packQuantity: 'Per pack', stock: { NGT: 'Qty NGT', RVS: 'Qty RVS' },
    })
    expect(text).toBe('SKU from “Part ref”, list price from “Sell each”, trade cost from “Our cost”, pack quantity from “Per pack”, '
      + 'description from “Info”, stock at NGT from “Qty NGT”, stock at RVS from “Qty RVS”.')
  })

  it('says nothing for a file whose columns are not chosen yet', () => {
    expect(columnsReadText(null)).toBe('')
  })
})

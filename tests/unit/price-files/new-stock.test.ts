import { describe, expect, it } from 'vitest'
import { emptyMapping } from '../../../server/services/price-files/mapping'
import { RowPacker } from '../../../server/services/price-files/row-batches'
import { Comparison } from '../../../server/services/price-files/compare'
import { SkuSlots } from '../../../server/services/price-files/sku-slots'
import type { CatalogueSnapshot } from '../../../server/services/price-files/snapshot'
import type { ColumnMapping } from '#shared/types/price-files'

// the stock columns in the other order than the branches' (NGT has the lower id)
const headers = ['sku', 'description', 'type', 'list_price', 'stock_RVS', 'stock_NGT']
const mapping: ColumnMapping = { ...emptyMapping(), sku: 'sku', description: 'description', type: 'type', listPrice: 'list_price', stock: { RVS: 'stock_RVS', NGT: 'stock_NGT' } }

/** A catalogue of two parts, KF-1 and KF-2, with the branches NGT then RVS. */
function snapshot(): CatalogueSnapshot {
  const skus = new SkuSlots()
  skus.add('KF-1'); skus.add('KF-2')
  return {
    size: 2, firstRow: new Int32Array(2), branchOrder: ['NGT', 'RVS'],
    slot: (s: string) => skus.get(s), id: (i: number) => i + 1, sku: (i: number) => skus.sku(i), discontinued: () => false, pricedBy: () => 1,
    movedStock: () => null, part: (i: number) => ({ id: i + 1, status: 'active', list: 1000, trade: null, core: 0, pack: 1 }),
  } as unknown as CatalogueSnapshot
}

describe('the new parts\' stock counts the apply reads', () => {
  it('are one chunk per chunk of new findings, the counts of each in the branches\' order, repeats left out', async () => {
    const rows = [
      ['NEW-1', 'Pad set 1', 'pad_set', '10.00', '3', '4'],
      ['NEW-2', 'Disc 2', 'disc', '20.00', '5', ''],
      ['KF-1', '', '', '11.00', '1', '1'],
      ['NEW-3', 'Drum 3', 'drum', '30.00', '', '6'],
      ['NEW-2', 'Disc 2 again', 'disc', '21.00', '1', '1'],
      ['NEW-4', 'Hose 4', 'hose', '40.00', '0', '8'],
    ]
    const packer = new RowPacker({ mapping, headers, decimal: '.' }, 2, 2)
    const batches = [...packer.add(rows.map((cells, i) => ({ rowNumber: i + 2, cells })), 0)]
    const last = packer.finish(0)
    if (last) batches.push(last)
    const snap = snapshot()
    const comparison = new Comparison(mapping)
    for (const b of batches) comparison.compare(b, snap)
    await comparison.settle(snap)
    const lists = new Map((await comparison.result()).lists)
    const fresh = lists.get('new')!.flatMap((c) => JSON.parse(c.json) as unknown[][]).map((f) => f[1])
    expect(fresh).toEqual(['NEW-1', 'NEW-3', 'NEW-4']) // NEW-2 twice: both rows refused
    // the catalogue part the file leaves out, KF-2 (id 2 in the snapshot above), is stored as its id alone
    expect(lists.get('missing')!.flatMap((c) => JSON.parse(c.json) as unknown[])).toEqual([2])
    const stock = lists.get('newstock')!
    expect(stock.map((c) => c.size)).toEqual(lists.get('new')!.map((c) => c.size))
    // worked by hand from the rows: NGT then RVS for NEW-1, NEW-3, NEW-4 (null: no count)
    expect(stock.map((c) => JSON.parse(c.json))).toEqual([{ codes: ['NGT', 'RVS'], counts: [4, 3, 6, null, 8, 0] }])
  })
})

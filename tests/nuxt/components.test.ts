import { describe, expect, it } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import SafetyCaution from '~/components/ui/SafetyCaution.vue'
import VerdictBadge from '~/components/inspections/VerdictBadge.vue'
import ShareBar from '~/components/calculations/ShareBar.vue'
import StockLevels from '~/components/catalogue/StockLevels.vue'
import PriceCountTiles from '~/components/price-files/PriceCountTiles.vue'
import PriceChangesTable from '~/components/price-files/PriceChangesTable.vue'
import GarageFigures from '~/components/dashboard/GarageFigures.vue'

describe('SafetyCaution', () => {
  it('always states that brakes are safety-critical and defers to the maker and qualified practice', async () => {
    const w = await mountSuspended(SafetyCaution)
    expect(w.get('[role="note"]').attributes('aria-label')).toBe('Safety caution')
    expect(w.text()).toContain('Brakes are safety-critical.')
    expect(w.text()).toContain("vehicle maker's data")
    expect(w.text()).toContain('qualified practice')
  })
  it('adds the theoretical-figures caveat on hydraulics pages', async () => {
    const w = await mountSuspended(SafetyCaution, { props: { topic: 'hydraulics' } })
    expect(w.text()).toMatch(/theoretical/i)
    expect(w.text()).toMatch(/push-out pressure/)
  })
})

describe('VerdictBadge', () => {
  it.each([['ok', 'Sound'], ['advise', 'Fix soon'], ['fail', 'Fix now']] as const)('shows %s in the words of the severity scale, not colour alone', async (verdict, text) => {
    const w = await mountSuspended(VerdictBadge, { props: { verdict } })
    expect(w.text()).toBe(text)
    expect(w.get('span').attributes('data-verdict')).toBe(verdict)
  })
})

describe('ShareBar', () => {
  it('draws original and replacement front shares and says them for screen readers', async () => {
    const w = await mountSuspended(ShareBar, { props: { original: 68.4, replacement: 64.9 } })
    const bars = w.findAll('[role="img"]')
    expect(bars).toHaveLength(2)
    expect(bars[0]!.attributes('aria-label')).toMatch(/Original: front 68[.,]4 percent, rear 31[.,]6 percent/)
    expect(bars[1]!.attributes('aria-label')).toMatch(/Replacement: front 64[.,]9 percent/)
  })
  it('shows only the original when there is no replacement', async () => {
    const w = await mountSuspended(ShareBar, { props: { original: 70, replacement: null } })
    expect(w.findAll('[role="img"]')).toHaveLength(1)
  })
})

describe('StockLevels', () => {
  it('gives each branch\'s count its unit, "none" for an empty shelf, and the branch\'s name on hover', async () => {
    const w = await mountSuspended(StockLevels, { props: { stock: [{ branchCode: 'NGT', quantity: 4, branchName: 'Northgate' }, { branchCode: 'RVS', quantity: 0 }] } })
    const pills = w.findAll('span > span')
    expect(pills.map((p) => p.text())).toEqual(['NGT 4 in stock', 'RVS none'])
    expect(pills[0]!.attributes('title')).toBe('Northgate')
  })
})

describe('PriceCountTiles', () => {
  it('names what each count counts: rows or parts', async () => {
    const w = await mountSuspended(PriceCountTiles, { props: { counts: { rows: 4, new: 2, changed: 1, unchanged: 0, missing: 796, rejected: 1, large: 0 } } })
    expect(w.findAll('dt').map((d) => d.text())).toEqual(['Rows read', 'Price changes', 'New parts', 'Parts unchanged', 'Parts not in this file', 'Refused rows'])
    expect(w.get('[data-count="missing"]').text()).toBe('796')
  })
})

describe('PriceChangesTable', () => {
  it('gives the pack its unit and each branch\'s stock its words, and labels every cell for the phone layout', async () => {
    const row = {
      id: 1, kind: 'changed', rowNumber: 7, sku: 'KF-7', description: 'Front pad set', partType: 'pad_set',
      oldListMinor: 4_000, newListMinor: 4_400, oldTradeMinor: 2_000, newTradeMinor: 2_000, oldCoreMinor: null, newCoreMinor: null,
      oldPack: 1, newPack: 4, changePct: 10, large: false, stock: { NGT: 4, RVS: 0 }, columns: null, reason: null,
    }
    registerEndpoint('/api/price-files/901/changes', () => ({ data: [row], meta: { page: 1, pageSize: 25, total: 1, pages: 1 } }))
    const w = await mountSuspended(PriceChangesTable, { props: { priceFileId: 901, kind: 'changed' } })
    await flushPromises()
    const cells = w.findAll('tbody td')
    const cell = (label: string) => cells.find((c) => c.attributes('data-label') === label)!.text()
    expect(cell('Pack')).toBe('1 piece → 4 pieces')
    expect(w.findAll('td[data-label="Stock"] span > span').map((p) => p.text())).toEqual(['NGT 4 in stock', 'RVS none'])
    // every cell names its column, so the phone's one-card-per-row layout can say what each figure is
    expect(cells.every((c) => c.attributes('data-label'))).toBe(true)
    expect(w.get('table').classes()).toContain('row-cards')
  })
})

describe('GarageFigures', () => {
  it('counts in the singular when there is one, and says "no invoices" in words, not in the figure\'s digits', async () => {
    const d = {
      range: { from: '2026-11-06', to: '2026-12-05', days: 30, timeZone: 'Europe/London' }, currency: 'GBP',
      quotes: { sent: 1, approved: 1, rateBp: 10_000 },
      lines: { required: { decided: 2, approved: 1, rateBp: 5_000 }, advised: { decided: 1, approved: 0, rateBp: 0 } },
      declinedAdvised: [{ key: 'disc', label: 'Discs', count: 1 }],
      jobs: { invoices: 0, grossMinor: 0, averageMinor: null }, spendByMonth: [], reminders: { sent: 1, quotesApproved: 0, workMinor: 0 },
    }
    const w = await mountSuspended(GarageFigures, { props: { d } })
    const note = (id: string) => w.get(`[data-testid="${id}"]`).element.nextElementSibling!.textContent
    expect(note('dash-quotes')).toBe('1 of 1 quote sent (wholly or partly)')
    expect(note('dash-required')).toBe('1 of 2 lines owners decided')
    expect(note('dash-advised')).toBe('0 of 1 line owners decided')
    expect(note('dash-job')).toBe('0 invoices to owners, £0.00 with VAT')
    expect(w.get('[data-testid="dash-job"]').classes()).not.toContain('mono')
    expect(w.get('[data-testid="dash-declined"] tbody').text()).toBe('Discs1 line')
    expect(w.get('[data-testid="dash-reminders"]').text()).toContain('1 e-mail')
  })
})

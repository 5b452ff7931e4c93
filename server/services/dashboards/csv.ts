/**
 * A dashboard as CSV: one row a figure (section, item, value, unit), the same figures as the screen; money in major
 * units with two decimals, rates as percentages with one decimal. Plain Node.
 */
import { safeCsv } from '../csv-export'
import { AGEING_BUCKETS, AGEING_LABELS } from '../../../shared/types/money-owed'
import type { DistributorDashboard, GarageDashboard } from '../../../shared/types/dashboards'

type Row = [section: string, item: string, value: number | string | null, unit: string]

const money = (minor: number) => (minor / 100).toFixed(2)
const pct = (bp: number | null) => (bp === null ? '' : (bp / 100).toFixed(1))

function csvOf(rows: Row[]): string {
  return safeCsv(rows.map(([section, item, value, unit]) => ({ section, item, value: value ?? '', unit })), {
    header: true, columns: [{ key: 'section', header: 'Section' }, { key: 'item', header: 'Item' }, { key: 'value', header: 'Value' }, { key: 'unit', header: 'Unit' }],
  })
}

export function distributorCsv(d: DistributorDashboard): string {
  const c = d.currency
  return csvOf([
    ['Range', 'From', d.range.from, 'day'], ['Range', 'To', d.range.to, 'day'],
    ['Sales', 'Net sales', money(d.sales.netMinor), c], ['Sales', 'Orders', d.sales.orders, 'orders'],
    ...d.sales.byDay.flatMap((x): Row[] => [['Sales by day', x.day, money(x.netMinor), c], ['Orders by day', x.day, x.orders, 'orders']]),
    ...d.sales.byBranch.map((x): Row => ['Sales by branch', x.branch, money(x.netMinor), c]),
    ['Gross margin', 'Margin', money(d.margin.marginMinor), c], ['Gross margin', 'Margin rate', pct(d.margin.marginBp), '%'],
    ['Gross margin', 'Lines without a trade cost (left out)', d.margin.linesWithoutCost, 'lines'],
    ['Fill rate', 'First-time fill rate', pct(d.fillRate.rateBp), '%'], ['Fill rate', 'Lines sent', d.fillRate.lines, 'lines'], ['Fill rate', 'Filled first time', d.fillRate.filled, 'lines'],
    ['Back-orders open', 'Lines', d.backOrders.lines, 'lines'], ['Back-orders open', 'Units', d.backOrders.units, 'units'],
    ...d.returnsByReason.map((x): Row => ['Returns by reason', x.label, x.count, 'returns']),
    ...d.topParts.map((x): Row => ['Top parts', `${x.sku} ${x.description}`, money(x.netMinor), c]),
    ...d.topGarages.map((x): Row => ['Top garages', x.name, money(x.netMinor), c]),
    ...AGEING_BUCKETS.map((b): Row => ['Owed by garages', AGEING_LABELS[b], money(d.overdue[b]), c]),
    ...(d.lastPriceFile ? [
      ['Last price file', 'Applied', d.lastPriceFile.activatedOn, 'day'], ['Last price file', 'Dearer', d.lastPriceFile.dearer, 'parts'],
      ['Last price file', 'Cheaper', d.lastPriceFile.cheaper, 'parts'], ['Last price file', 'Unchanged', d.lastPriceFile.unchanged, 'parts'],
      ['Last price file', 'New', d.lastPriceFile.added, 'parts'], ['Last price file', 'Mean list price change', pct(d.lastPriceFile.meanChangeBp), '%'],
    ] as Row[] : []),
  ])
}

export function garageCsv(d: GarageDashboard): string {
  const c = d.currency
  return csvOf([
    ['Range', 'From', d.range.from, 'day'], ['Range', 'To', d.range.to, 'day'],
    ['Quotes', 'Sent', d.quotes.sent, 'quotes'], ['Quotes', 'Approved', d.quotes.approved, 'quotes'], ['Quotes', 'Approval rate', pct(d.quotes.rateBp), '%'],
    ['Required lines', 'Approval rate', pct(d.lines.required.rateBp), '%'], ['Required lines', 'Decided', d.lines.required.decided, 'lines'],
    ['Advised lines', 'Approval rate', pct(d.lines.advised.rateBp), '%'], ['Advised lines', 'Decided', d.lines.advised.decided, 'lines'],
    ...d.declinedAdvised.map((x): Row => ['Advised work declined', x.label, x.count, 'lines']),
    ['Jobs', 'Invoices to owners', d.jobs.invoices, 'invoices'], ['Jobs', 'Average job', d.jobs.averageMinor === null ? null : money(d.jobs.averageMinor), c],
    ...d.spendByMonth.map((x): Row => ['Spend with the distributor', x.month, money(x.totalMinor), c]),
    ['Reminders', 'Sent', d.reminders.sent, 'e-mails'], ['Reminders', 'Quotes approved from them', d.reminders.quotesApproved, 'quotes'],
    ['Reminders', 'Work brought back', money(d.reminders.workMinor), c],
  ])
}

/**
 * Quotes without HTTP, one job per file (plain Node, so the seed can use them too):
 *  settings.ts          the garage's quoting settings and their defaults
 *  references.ts        numbers, references, the PDF's name, the owner's link token
 *  rows.ts              reading a quote and its lines; what counts in its totals; expiry when read
 *  line-pricing.ts      a line's price (net captured from the prices in use, markup, core deposit); who may price
 *  lines.ts             writing one line (add, change)
 *  revisions.ts         which quote a change applies to (the draft, or a new revision), audited
 *  inspection-lines.ts  findings and lines from an inspection
 *  drafting.ts          start a quote, change its particulars, add an inspection, ask for a revision
 *  line-changes.ts      the garage's line changes (add, change, remove)
 *  sending.ts           send to the owner
 *  decision.ts          the owner's decision
 *  garage-view.ts       the quote for the garage's people;  owner-view.ts: for the owner
 *  list.ts              the garage's list, paged
 *  declined-work.ts     declined safety work with its signed acknowledgements, for a vehicle's history
 *  core-refunds.ts      a passed-on core deposit's refund to the owner, when the distributor accepts the core
 *  pdf.ts, pdf-sections.ts, document.ts  the PDF (drawing; totals and decision; with the garage and its logo)
 *  mail.ts              the e-mails
 */
export * from './settings'
export * from './references'
export * from './rows'
export * from './line-pricing'
export * from './lines'
export * from './revisions'
export * from './inspection-lines'
export * from './drafting'
export * from './line-changes'
export * from './sending'
export * from './decision'
export * from './garage-view'
export * from './owner-view'
export * from './list'
export * from './declined-work'
export * from './core-refunds'
export * from './pdf'
export * from './pdf-sections'
export * from './document'
export * from './mail'

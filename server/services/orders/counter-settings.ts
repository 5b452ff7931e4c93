/**
 * The counter's configurable periods, read from the environment (each with its default):
 * - BORELINE_SUPPLIER_LEAD_DAYS (2): working days for a back-ordered part to reach the branch from the supplier;
 * - BORELINE_RETURN_DAYS (30): days after dispatch a wrong or unneeded part may be sent back;
 * - BORELINE_WARRANTY_DAYS (365): days after dispatch a faulty part may be claimed under warranty;
 * - BORELINE_RESTOCKING_AFTER_DAYS (14) and BORELINE_RESTOCKING_PERCENT (15): an unneeded part sent back later
 *   than that many days after dispatch is credited less that percentage (a restocking charge).
 * Plain Node.
 */

export interface CounterSettings {
  supplierLeadDays: number
  returnDays: number
  warrantyDays: number
  restockingAfterDays: number
  /** basis points */
  restockingBp: number
}

function whole(value: string | undefined, fallback: number, min: number, max: number): number {
  if (value === undefined || value.trim() === '') return fallback
  const n = Number(value)
  return Number.isFinite(n) && n >= min && n <= max ? Math.round(n) : fallback
}

export function counterSettings(env: NodeJS.ProcessEnv = process.env): CounterSettings {
  const percent = Number(env.BORELINE_RESTOCKING_PERCENT ?? 15)
  return {
    supplierLeadDays: whole(env.BORELINE_SUPPLIER_LEAD_DAYS, 2, 0, 60),
    returnDays: whole(env.BORELINE_RETURN_DAYS, 30, 0, 3650),
    warrantyDays: whole(env.BORELINE_WARRANTY_DAYS, 365, 0, 3650),
    restockingAfterDays: whole(env.BORELINE_RESTOCKING_AFTER_DAYS, 14, 0, 3650),
    restockingBp: Number.isFinite(percent) && percent >= 0 && percent <= 100 ? Math.round(percent * 100) : 1500,
  }
}

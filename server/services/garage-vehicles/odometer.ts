/**
 * Odometer readings of a garage vehicle: recorded on their own, or taken from an inspection's or a quote's
 * odometer text ("68 412 mi", "131,000 km"). Plain Node.
 */
import type { Transaction } from 'sequelize'
import { OdometerReading } from '../../models/garage-vehicles'
import type { OdometerView } from '../../../shared/types/garage-vehicles'

/** A reading from free text; a number without a unit is taken in miles (the UK default); null when unreadable. */
export function parseOdometer(text: string): { reading: number; unit: 'mi' | 'km' } | null {
  const m = /^\s*([0-9][0-9\s,.]*?)\s*(mi|miles?|km|kms|kilometres?)?\s*$/i.exec(text)
  if (!m) return null
  const reading = Number(m[1]!.replace(/[\s,.]/g, ''))
  if (!Number.isSafeInteger(reading) || reading > 2_000_000) return null
  return { reading, unit: m[2] && /^k/i.test(m[2]) ? 'km' : 'mi' }
}

const today = (now: Date) => now.toISOString().slice(0, 10)

export async function addReading(
  t: Transaction, garageVehicleId: number, r: { reading: number; unit: 'mi' | 'km'; readOn?: string }, source: OdometerReading['source'], now = new Date(),
): Promise<OdometerReading> {
  return OdometerReading.create({ garageVehicleId, reading: r.reading, unit: r.unit, readOn: r.readOn ?? today(now), source, createdAt: now }, { transaction: t })
}

/** Records the odometer text of an inspection or a quote, when it reads as a number. */
export async function noteOdometerText(t: Transaction, garageVehicleId: number | null | undefined, text: string, source: 'inspection' | 'quote'): Promise<void> {
  const parsed = garageVehicleId ? parseOdometer(text) : null
  if (parsed && garageVehicleId) await addReading(t, garageVehicleId, parsed, source)
}

export function odometerView(r: OdometerReading): OdometerView {
  return { id: r.id, reading: r.reading, unit: r.unit, readOn: String(r.readOn), source: r.source }
}

/** The latest reading of each vehicle given. */
export async function latestReadings(garageVehicleIds: number[]): Promise<Map<number, OdometerView>> {
  const out = new Map<number, OdometerView>()
  if (!garageVehicleIds.length) return out
  const rows = await OdometerReading.findAll({ where: { garageVehicleId: garageVehicleIds }, order: [['readOn', 'DESC'], ['id', 'DESC']] })
  for (const r of rows) if (!out.has(r.garageVehicleId)) out.set(r.garageVehicleId, odometerView(r))
  return out
}

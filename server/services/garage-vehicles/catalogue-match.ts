/**
 * From what a VIN or the vehicle-data service says (make, model, years, engine size, fuel) to the catalogue's
 * vehicles: every vehicle of that make (and model, when known) built in one of the years, narrowed by engine size
 * and fuel when those still leave a choice. Plain Node.
 */
import { vehicleSummaries, vehicleLabel, type VehicleSummary } from '../catalogue/vehicles'
import type { CatalogueVehicleRef } from '../../../shared/types/garage-vehicles'

export function vehicleRef(v: Pick<VehicleSummary, 'id' | 'make' | 'model' | 'generation' | 'body' | 'yearFrom' | 'yearTo'> & Partial<VehicleSummary>): CatalogueVehicleRef {
  return { id: v.id, label: vehicleLabel(v), make: v.make, model: v.model, yearFrom: v.yearFrom, yearTo: v.yearTo }
}

export interface CatalogueClues {
  make: string
  model?: string
  years: number[]
  engineCc?: number | null
  fuel?: string
}

const same = (a: string, b: string) => a.localeCompare(b, 'en', { sensitivity: 'base' }) === 0
const builtIn = (v: VehicleSummary, years: number[]) => !years.length || years.some((y) => v.yearFrom <= y && (v.yearTo === null || y <= v.yearTo))
/** Engine sizes are given to the cc by one source and rounded by another: within 50 cc is the same engine. */
const sameEngine = (v: VehicleSummary, cc: number) => v.engineCc !== null && Math.abs(v.engineCc - cc) <= 50

/** The catalogue vehicles that fit the clues; narrower clues are applied only while some vehicle is left. */
export async function matchCatalogue(clues: CatalogueClues): Promise<CatalogueVehicleRef[]> {
  let found = (await vehicleSummaries()).filter((v) => same(v.make, clues.make) && (!clues.model || same(v.model, clues.model)) && builtIn(v, clues.years))
  const narrow = (keep: (v: VehicleSummary) => boolean) => {
    const left = found.filter(keep)
    if (left.length) found = left
  }
  if (clues.engineCc) narrow((v) => sameEngine(v, clues.engineCc!))
  if (clues.fuel) narrow((v) => same(v.fuel, clues.fuel!))
  return found.map(vehicleRef)
}

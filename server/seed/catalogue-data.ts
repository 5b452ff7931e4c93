/**
 * The invented demo catalogue, generated deterministically (seeded PRNG) so every run gives the same rows.
 *
 * Invented makes and models, invented product lines, realistic figures (common practice, from memory where noted):
 * discs 240-350 mm with a minimum thickness 2 mm under nominal for vented discs (1-1.5 mm for solid ones), floating
 * calipers with one 38-60 mm piston or two 40-45 mm pistons, fixed four-piston calipers, master cylinder bores in
 * the usual inch sizes (19.05, 20.64, 22.22, 23.81, 25.4 mm = 3/4 to 1 in, NIST SP 811 for 1 in = 25.4 mm), drums
 * 203-254 mm with a maximum diameter 1.5-2 mm over nominal and wheel cylinders 17.46-23.81 mm.
 *
 * Consistency the unit tests check: pads fit the calipers with the same pad shape; discs, calipers, wheel cylinders
 * and master cylinders fitted to a vehicle agree with its original-equipment brake (diameter, piston diameters,
 * bores); the only exceptions are two declared uprated parts ({@link BORE_MISMATCH}) whose fitment note says so.
 *
 * Parts of the same fitting dimensions share one "component": one SKU per product line, one set of OE numbers.
 */
import { normaliseIdentifier } from '../../shared/schemas/catalogue/params'
import type { PartType } from '../../shared/schemas/catalogue/part-types'
import type { AxleName, FitmentAxle } from '../../shared/types/axles'

/** mulberry32: a small, well-known 32-bit PRNG; deterministic for a given seed. */
export function prng(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

export interface SeedOption { key: string; label: string; question: string; values: { value: string; label: string }[] }
export interface SeedBrake {
  axle: AxleName
  qualifiers: Record<string, string>
  kind: 'disc' | 'drum'
  discDiameterMm?: number; discThicknessMm?: number; discMinThicknessMm?: number; discVented?: boolean
  drumDiameterMm?: number; drumMaxDiameterMm?: number
  caliperType?: 'fixed' | 'floating'; pistonDiametersMm?: number[]; wheelCylinderBoreMm?: number
  maxRunoutMm: number; maxThicknessVariationMm?: number
  padEdgeMarginMm?: number; drumShoeLayout?: 'leading-trailing' | 'two-leading' | 'duo-servo'
}
export interface SeedVehicle {
  key: string
  make: string; model: string; generation: string; body: string; yearFrom: number; yearTo: number | null
  engineCode: string; engineCc: number | null; fuel: string; powerKw: number; drive: 'FWD' | 'RWD' | 'AWD'
  circuitSplit: 'front-rear' | 'diagonal'; steeringSide: 'left' | 'right'; fluidGrade: string; tyreSize: string; kerbMassKg: number
  mcBoreMm: number; mcTandem: boolean; mcStrokeMm: number; pedalRatio: number; boosterRatio: number | null
  parkingBrake: 'cable' | 'electric'
  /** Grip and balance figures (vehicleDynamics): typical of the class, invented for the demo. */
  boosterRunOutKPa: number | null; wheelbaseMm: number; cogHeightMm: number; frontStaticSharePercent: number
  ladenMassKg: number; ladenCogHeightMm: number; ladenFrontSharePercent: number
  rearValveKneeKPa: number | null; rearValveLadenKneeKPa: number | null; rearValveSlope: number | null; electronicDistribution: boolean
  options: SeedOption[]
  brakes: SeedBrake[]
}
export interface SeedPart {
  sku: string; type: PartType; productLine: string; description: string; specs: Record<string, unknown>
  status: 'active' | 'discontinued'
  oe: { oeNumber: string; maker: string }[]
  listPriceMinor: number; tradeCostMinor: number; coreDepositMinor: number
  stock: { NGT: number; RVS: number }
}
export interface SeedFitment {
  vehicleKey: string; sku: string; axle: FitmentAxle; side: 'left' | 'right' | 'pair'
  quantity: number; qualifiers: Record<string, string>; note: string
}
export interface SeedSupersession { oldSku: string; newSku: string; note: string }
export interface SeedCatalogue { vehicles: SeedVehicle[]; parts: SeedPart[]; fitments: SeedFitment[]; supersessions: SeedSupersession[] }

// ---------------------------------------------------------------------------------------------------------------

type Size = 'small' | 'medium' | 'large' | 'suv' | 'van'
interface MakeDef { make: string; oe: (r: () => number) => string; hub: { boltHoles: number; pcdMm: number; centreBoreMm: number }; models: { name: string; body: string; size: Size; gens: [string, number, number | null][] }[] }

const pick = <T>(r: () => number, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)]!
const between = (r: () => number, lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1))
const digits = (r: () => number, n: number) => Array.from({ length: n }, () => Math.floor(r() * 10)).join('')
const letter = (r: () => number) => 'ABCDEFGHJKLMNPRSTUVWXYZ'[Math.floor(r() * 23)]!

/** Seven invented makes, each with its own OE number format and wheel hub. */
export const MAKES: MakeDef[] = [
  { make: 'Veltra', oe: (r) => `VLT ${digits(r, 3)} ${digits(r, 3)} ${letter(r)}`, hub: { boltHoles: 5, pcdMm: 112, centreBoreMm: 57.1 }, models: [
    { name: 'Pennon', body: 'hatchback', size: 'medium', gens: [['Mk1', 2012, 2018], ['Mk2', 2018, null]] },
    { name: 'Skerry', body: 'estate', size: 'large', gens: [['Series A', 2015, null]] },
    { name: 'Tolvan', body: 'SUV', size: 'suv', gens: [['Series A', 2017, null]] },
  ] },
  { make: 'Kaskel', oe: (r) => `KSK-34-${digits(r, 4)}-${digits(r, 2)}`, hub: { boltHoles: 5, pcdMm: 120, centreBoreMm: 72.6 }, models: [
    { name: 'Orrin', body: 'saloon', size: 'large', gens: [['E1', 2011, 2017], ['E2', 2017, null]] },
    { name: 'Vell', body: 'hatchback', size: 'medium', gens: [['V3', 2014, 2021]] },
    { name: 'Hestow', body: 'SUV', size: 'suv', gens: [['H1', 2016, null]] },
  ] },
  { make: 'Durmond', oe: (r) => `DMD${digits(r, 6)}`, hub: { boltHoles: 4, pcdMm: 100, centreBoreMm: 56.6 }, models: [
    { name: 'Caddow', body: 'hatchback', size: 'small', gens: [['2nd gen', 2010, 2016], ['3rd gen', 2016, null]] },
    { name: 'Ferrow', body: 'saloon', size: 'medium', gens: [['F2', 2013, 2020]] },
    { name: 'Hask', body: 'city car', size: 'small', gens: [['Mk1', 2015, null]] },
  ] },
  { make: 'Lystrom', oe: (r) => `LYS ${digits(r, 2)} ${digits(r, 4)} ${digits(r, 2)}`, hub: { boltHoles: 5, pcdMm: 108, centreBoreMm: 63.4 }, models: [
    { name: 'Ensa', body: 'estate', size: 'large', gens: [['Type 2', 2014, null]] },
    { name: 'Quarn', body: 'SUV', size: 'suv', gens: [['Type 1', 2016, null]] },
    { name: 'Tovi', body: 'hatchback', size: 'medium', gens: [['Type 3', 2015, null]] },
  ] },
  { make: 'Brenmoor', oe: (r) => `BRM.${digits(r, 3)}.${digits(r, 3)}`, hub: { boltHoles: 5, pcdMm: 114.3, centreBoreMm: 67.1 }, models: [
    { name: 'Halyard', body: 'saloon', size: 'large', gens: [['Gen 4', 2013, 2019], ['Gen 5', 2019, null]] },
    { name: 'Sett', body: 'hatchback', size: 'small', gens: [['Gen 2', 2014, null]] },
    { name: 'Carrow', body: 'MPV', size: 'medium', gens: [['Gen 1', 2012, 2019]] },
  ] },
  { make: 'Taviro', oe: (r) => `TAV/${digits(r, 5)}`, hub: { boltHoles: 4, pcdMm: 98, centreBoreMm: 58.1 }, models: [
    { name: 'Calo', body: 'city car', size: 'small', gens: [['Serie 1', 2012, null]] },
    { name: 'Mezzane', body: 'hatchback', size: 'medium', gens: [['Serie 2', 2016, null]] },
    { name: 'Sprindle', body: 'estate', size: 'medium', gens: [['Serie 1', 2013, 2020]] },
  ] },
  { make: 'Quillan', oe: (r) => `QLN ${digits(r, 4)}-${digits(r, 3)}`, hub: { boltHoles: 5, pcdMm: 118, centreBoreMm: 71.1 }, models: [
    { name: 'Dray', body: 'panel van', size: 'van', gens: [['D2', 2014, null]] },
    { name: 'Hopper', body: 'pick-up', size: 'van', gens: [['P1', 2016, null]] },
    { name: 'Rook', body: 'MPV', size: 'large', gens: [['R1', 2015, null]] },
  ] },
]

/**
 * The two vehicles whose catalogue lists an uprated part with a different bore than original equipment (for the
 * bore-change check): a master cylinder 22.22 -> 25.40 mm (7/8 in -> 1 in) and a front caliper 54 -> 57 mm.
 */
export const BORE_MISMATCH = {
  masterCylinder: { make: 'Quillan', model: 'Dray', oeBoreMm: 22.22, replacementBoreMm: 25.4, productLine: 'Carrick Uprated' },
  caliper: { make: 'Veltra', model: 'Pennon', generation: 'Mk2', oePistonMm: 54, replacementPistonMm: 57, productLine: 'Carrick Uprated' },
} as const

/** The usual inch bores as the catalogue states them, mm: master cylinders 3/4 to 1 in, wheel cylinders 11/16 to 15/16 in. */
export const MC_BORES = [19.05, 20.64, 22.22, 23.81, 25.4]
export const WC_BORES = [17.46, 19.05, 20.64, 22.22, 23.81]

interface DiscCfg { diameterMm: number; thicknessMm: number; minThicknessMm: number; vented: boolean; heightMm: number }
interface CaliperCfg { caliperType: 'fixed' | 'floating'; pistonCount: number; pistonDiametersMm: number[] }
interface DrumCfg { diameterMm: number; maxDiameterMm: number; widthMm: number; wcBoreMm: number }
interface Platform {
  make: MakeDef; model: MakeDef['models'][number]; gen: [string, number, number | null]
  size: Size
  front: { disc: DiscCfg; caliper: CaliperCfg; padDims: [number, number, number] }[] // one or two (option)
  rearDisc: { disc: DiscCfg; caliper: CaliperCfg; padDims: [number, number, number] } | null
  rearDrum: DrumCfg | null
  mcBoreMm: number; mcStrokeMm: number; split: 'front-rear' | 'diagonal'; drive: 'FWD' | 'RWD' | 'AWD'
  pedalRatio: number; boosterRatio: number
  tyre: string; massKg: number
  padSensor: 'none' | 'integrated' | 'separate'
  frontHoseMm: number; rearHoseMm: number; sensorLengthMm: number
}

function discCfg(r: () => number, diameterMm: number, thicknessMm: number, vented: boolean): DiscCfg {
  // vented discs may wear 2 mm, solid ones 1-1.5 mm (common practice, from memory)
  const wear = vented ? 2 : pick(r, [1, 1.5])
  return { diameterMm, thicknessMm, minThicknessMm: thicknessMm - wear, vented, heightMm: pick(r, [34.5, 38, 40.5, 44, 46.5, 49]) }
}

function platformFor(r: () => number, make: MakeDef, model: MakeDef['models'][number], gen: [string, number, number | null], forcedTwoFront = false): Platform {
  const size = model.size
  let front: Platform['front'], rearDisc: Platform['rearDisc'] = null, rearDrum: DrumCfg | null = null
  const floating = (d: number): CaliperCfg => ({ caliperType: 'floating', pistonCount: 1, pistonDiametersMm: [d] })
  const twin = (d: number): CaliperCfg => ({ caliperType: 'floating', pistonCount: 2, pistonDiametersMm: [d, d] })
  const fixed4 = (a: number, b: number): CaliperCfg => ({ caliperType: 'fixed', pistonCount: 4, pistonDiametersMm: [a, b] })
  let mcBoreMm: number, split: Platform['split'] = 'diagonal', drive: Platform['drive'] = 'FWD'
  let tyre: string, massKg: number
  switch (size) {
    case 'small': {
      const d = pick(r, [256, 262, 266, 280])
      front = [{ disc: discCfg(r, d, d >= 266 ? 22 : 20, true), caliper: floating(pick(r, [48, 52, 54])), padDims: [between(r, 112, 126), between(r, 48, 53), 17.5] }]
      if (r() < 0.5) rearDrum = { diameterMm: 203, maxDiameterMm: 204.5, widthMm: 38, wcBoreMm: pick(r, [17.46, 19.05]) }
      else { rearDrum = { diameterMm: 228.6, maxDiameterMm: 230.1, widthMm: 42, wcBoreMm: 19.05 }; rearDisc = { disc: discCfg(r, pick(r, [240, 249, 253]), 9, false), caliper: floating(pick(r, [34, 36, 38])), padDims: [between(r, 86, 95), 40, 15] } }
      mcBoreMm = pick(r, [19.05, 20.64, 22.22]); tyre = pick(r, ['175/65 R14', '185/65 R15', '195/55 R16']); massKg = between(r, 960, 1180)
      break
    }
    case 'medium': {
      const base = pick(r, [276, 280, 288])
      const bigCaliper = r() < 0.6
      front = [{ disc: discCfg(r, base, 25, true), caliper: floating(54), padDims: [between(r, 130, 138), between(r, 52, 58), 19] }]
      if (forcedTwoFront || r() < 0.6) {
        const big = base + pick(r, [12, 20, 24])
        front.push({ disc: discCfg(r, big, 25, true), caliper: bigCaliper ? floating(57) : floating(54), padDims: bigCaliper ? [between(r, 148, 156), between(r, 60, 64), 19.5] : front[0]!.padDims })
      }
      rearDisc = { disc: discCfg(r, pick(r, [253, 260, 272]), 10, false), caliper: floating(pick(r, [36, 38, 40])), padDims: [between(r, 95, 102), between(r, 41, 45), 16] }
      if (r() < 0.35) rearDrum = { diameterMm: 228.6, maxDiameterMm: 230.1, widthMm: 42, wcBoreMm: pick(r, [19.05, 20.64]) }
      mcBoreMm = pick(r, [22.22, 23.81]); tyre = pick(r, ['205/55 R16', '225/45 R17', '215/50 R17']); massKg = between(r, 1290, 1540)
      break
    }
    case 'large': {
      const d = pick(r, [312, 320, 330, 340])
      front = [{ disc: discCfg(r, d, pick(r, [28, 30]), true), caliper: r() < 0.5 ? twin(pick(r, [42, 44])) : floating(60), padDims: [between(r, 150, 160), between(r, 62, 68), 20] }]
      if (r() < 0.4) front.push({ disc: discCfg(r, d + 20, 30, true), caliper: fixed4(38, 42), padDims: [between(r, 158, 168), between(r, 64, 70), 16.5] })
      rearDisc = { disc: discCfg(r, pick(r, [290, 300, 310]), pick(r, [12, 20, 22]), r() < 0.5), caliper: floating(pick(r, [38, 40, 42])), padDims: [between(r, 100, 110), between(r, 44, 48), 16.5] }
      mcBoreMm = pick(r, [23.81, 25.4]); split = r() < 0.6 ? 'front-rear' : 'diagonal'; drive = pick(r, ['RWD', 'AWD', 'FWD'] as const)
      tyre = pick(r, ['225/45 R18', '245/40 R18', '225/50 R17']); massKg = between(r, 1580, 1890)
      break
    }
    case 'suv': {
      const d = pick(r, [330, 345, 350])
      front = [{ disc: discCfg(r, d, 32, true), caliper: r() < 0.5 ? fixed4(40, 44) : twin(45), padDims: [between(r, 158, 172), between(r, 66, 74), 17] }]
      rearDisc = { disc: discCfg(r, pick(r, [310, 320, 330]), 20, true), caliper: floating(pick(r, [42, 44])), padDims: [between(r, 105, 115), between(r, 46, 50), 17] }
      mcBoreMm = 25.4; split = 'front-rear'; drive = 'AWD'; tyre = pick(r, ['235/55 R19', '255/50 R19', '235/60 R18']); massKg = between(r, 1820, 2180)
      break
    }
    case 'van': {
      const d = pick(r, [296, 300, 308])
      front = [{ disc: discCfg(r, d, 28, true), caliper: r() < 0.5 ? floating(60) : twin(48), padDims: [between(r, 150, 160), between(r, 62, 68), 19] }]
      rearDrum = { diameterMm: 254, maxDiameterMm: 256, widthMm: 57, wcBoreMm: pick(r, [22.22, 23.81]) }
      rearDisc = { disc: discCfg(r, pick(r, [280, 290]), 16, false), caliper: floating(pick(r, [44, 45])), padDims: [between(r, 110, 118), 50, 17] }
      mcBoreMm = pick(r, [22.22, 23.81, 25.4]); split = 'front-rear'; drive = pick(r, ['FWD', 'RWD'] as const)
      tyre = pick(r, ['215/65 R16C', '225/65 R16C', '235/65 R16C']); massKg = between(r, 1760, 2120)
      break
    }
  }
  return {
    make, model, gen, size, front, rearDisc, rearDrum, mcBoreMm, mcStrokeMm: pick(r, [32, 34, 36, 38]), split, drive,
    pedalRatio: pick(r, [3.4, 3.6, 3.8, 4.0, 4.2]), boosterRatio: pick(r, [4.5, 5.0, 5.5, 6.0, 6.5]),
    frontHoseMm: between(r, 38, 52) * 10, rearHoseMm: between(r, 24, 36) * 10, sensorLengthMm: between(r, 12, 20) * 50,
    tyre, massKg, padSensor: size === 'small' ? 'none' : size === 'large' || size === 'suv' ? 'separate' : pick(r, ['none', 'integrated'] as const),
  }
}

const ENGINES: Record<Size, { code: string; cc: number | null; fuel: string; kw: number }[]> = {
  small: [{ code: 'P10T', cc: 999, fuel: 'petrol', kw: 70 }, { code: 'P12', cc: 1199, fuel: 'petrol', kw: 61 }, { code: 'D15', cc: 1499, fuel: 'diesel', kw: 74 }],
  medium: [{ code: 'P14T', cc: 1395, fuel: 'petrol', kw: 110 }, { code: 'D20', cc: 1968, fuel: 'diesel', kw: 110 }, { code: 'H18', cc: 1798, fuel: 'hybrid', kw: 90 }],
  large: [{ code: 'P20T', cc: 1984, fuel: 'petrol', kw: 180 }, { code: 'D20B', cc: 1995, fuel: 'diesel', kw: 140 }, { code: 'E-MX', cc: null, fuel: 'electric', kw: 200 }],
  suv: [{ code: 'P20T', cc: 1984, fuel: 'petrol', kw: 185 }, { code: 'D22', cc: 2179, fuel: 'diesel', kw: 147 }, { code: 'H25', cc: 2487, fuel: 'hybrid', kw: 160 }],
  van: [{ code: 'D20L', cc: 1997, fuel: 'diesel', kw: 96 }, { code: 'D20H', cc: 1997, fuel: 'diesel', kw: 125 }, { code: 'E-VN', cc: null, fuel: 'electric', kw: 100 }],
}

/**
 * Grip and balance by size, typical of the class and invented for the demo (common practice, from memory): wheelbase,
 * unladen centre of gravity height and static front axle share (less for rear-wheel drive, more for a front-heavy
 * van), the payload to the gross mass and what it does to the centre of gravity and the front share, and the
 * vacuum booster's run-out (knee) pressure.
 */
const DYNAMICS: Record<Size, { wheelbaseMm: number; cogHeightMm: number; frontSharePercent: number; payloadKg: number; ladenCogRiseMm: number; ladenShareDrop: number; runOutKPa: number }> = {
  small: { wheelbaseMm: 2450, cogHeightMm: 530, frontSharePercent: 62, payloadKg: 420, ladenCogRiseMm: 15, ladenShareDrop: 6, runOutKPa: 10000 },
  medium: { wheelbaseMm: 2640, cogHeightMm: 550, frontSharePercent: 60, payloadKg: 500, ladenCogRiseMm: 15, ladenShareDrop: 6, runOutKPa: 11000 },
  large: { wheelbaseMm: 2850, cogHeightMm: 540, frontSharePercent: 57, payloadKg: 520, ladenCogRiseMm: 15, ladenShareDrop: 5, runOutKPa: 12000 },
  suv: { wheelbaseMm: 2800, cogHeightMm: 660, frontSharePercent: 56, payloadKg: 600, ladenCogRiseMm: 25, ladenShareDrop: 6, runOutKPa: 12500 },
  van: { wheelbaseMm: 3100, cogHeightMm: 700, frontSharePercent: 60, payloadKg: 1000, ladenCogRiseMm: 80, ladenShareDrop: 14, runOutKPa: 12500 },
}

/**
 * A vehicle's grip and balance figures from its class, drive and fuel, without drawing on the PRNG (so the rest of
 * the catalogue stays as it was). Electronic brake-force distribution from 2014 on; before that a rear
 * pressure-limiting valve, load-sensing on vans (knee 2500 kPa, 5500 kPa laden, slope 0.3: typical, invented).
 */
export function vehicleDynamics(size: Size, body: string, drive: 'FWD' | 'RWD' | 'AWD', fuel: string, kerbMassKg: number, yearFrom: number, boosted: boolean) {
  const d = DYNAMICS[size]
  const electric = fuel === 'electric'
  // a floor battery lowers the centre of gravity and evens the axle loads; an MPV carries its third row at the back
  const cog = d.cogHeightMm - (electric ? 40 : 0)
  const share = d.frontSharePercent - (drive === 'RWD' ? 4 : drive === 'AWD' ? 1 : 0) - (electric ? 4 : 0) - (body === 'MPV' ? 3 : 0)
  const valve = size === 'van' || yearFrom < 2014
  return {
    boosterRunOutKPa: boosted ? d.runOutKPa : null,
    wheelbaseMm: d.wheelbaseMm, cogHeightMm: cog, frontStaticSharePercent: share,
    ladenMassKg: kerbMassKg + d.payloadKg, ladenCogHeightMm: cog + d.ladenCogRiseMm, ladenFrontSharePercent: share - d.ladenShareDrop,
    rearValveKneeKPa: valve ? 1200 : null, rearValveLadenKneeKPa: size === 'van' ? 5500 : null, rearValveSlope: valve ? 0.3 : null,
    electronicDistribution: yearFrom >= 2014,
  }
}

const DISC_LINES = ['Greywell Standard', 'Greywell Coated', 'Tenfold Performance']
const PAD_LINES: [string, string][] = [['Greywell Street', 'FF'], ['Ashfall Ceramic', 'FF'], ['Brindle Fleet', 'GG']]
const SHOE_LINES: [string, string][] = [['Greywell Street', 'EE'], ['Brindle Fleet', 'FF']]

/** Typical trade list prices in pence by type (invented; see money.ts for the rounding rule). */
const PRICE_RANGES: Record<PartType, [number, number]> = {
  disc: [2800, 8900], pad_set: [2400, 6900], caliper: [6800, 16500], drum: [3600, 7800], shoe_set: [2600, 5400],
  wheel_cylinder: [1200, 2600], hose: [850, 1900], fitting_kit: [650, 1600], wear_sensor: [520, 1250],
  master_cylinder: [5200, 12800], fluid: [650, 4600],
}
const SKU_PREFIX: Record<PartType, string> = {
  disc: 'KD', pad_set: 'KP', caliper: 'KC', drum: 'KR', shoe_set: 'KS', wheel_cylinder: 'KW', hose: 'KH',
  fitting_kit: 'KK', wear_sensor: 'KE', master_cylinder: 'KM', fluid: 'KF',
}

const fmt = (n: number) => (Number.isInteger(n) ? String(n) : String(Number(n.toFixed(2))))

/** Builds the whole demo catalogue. Pure: same output on every call. */
export function buildCatalogue(seed = 20261101): SeedCatalogue {
  const r = prng(seed)
  const vehicles: SeedVehicle[] = []
  const parts: SeedPart[] = []
  const fitments: SeedFitment[] = []
  const supersessions: SeedSupersession[] = []
  const bySku = new Map<string, SeedPart>()
  const counters = new Map<string, number>()
  // component signature -> SKUs (one per product line) and the makes that already have an OE number on it
  const components = new Map<string, { skus: string[]; oeMakes: Set<string>; applications: string[] }>()

  const nextSku = (type: PartType, suffix = '') => {
    const n = (counters.get(type) ?? 1000) + 1
    counters.set(type, n)
    return `${SKU_PREFIX[type]}-${n}${suffix}`
  }
  /** a component's base price, scaled per product line; list prices end in 0 or 5 pence */
  const basePrice = (type: PartType) => { const [lo, hi] = PRICE_RANGES[type]; return lo + r() * (hi - lo) }
  const price = (base: number, scale = 1) => {
    const list = Math.round((base * scale) / 5) * 5
    return { listPriceMinor: list, tradeCostMinor: Math.round(list * (0.55 + r() * 0.1)) }
  }
  const stock = () => {
    const one = () => (r() < 0.18 ? 0 : between(r, 1, 24))
    return { NGT: one(), RVS: one() }
  }

  /** One component: the SKUs of each product line for these fitting specs, created on first use. */
  function component(
    type: PartType, signature: string, lines: { productLine: string; specs: Record<string, unknown>; describe: (app: string) => string; core?: number; scale?: number; suffix?: string }[],
    make: MakeDef, application: string,
  ): string[] {
    const key = `${type}|${signature}`
    let c = components.get(key)
    if (!c) {
      c = { skus: [], oeMakes: new Set(), applications: [] }
      components.set(key, c)
      const base = nextSku(type)
      const basePriceMinor = basePrice(type)
      for (const [i, line] of lines.entries()) {
        const sku = i === 0 ? base : line.suffix ? `${base}${line.suffix}` : nextSku(type)
        const p: SeedPart = {
          sku, type, productLine: line.productLine, description: '', specs: line.specs, status: 'active', oe: [],
          ...price(basePriceMinor, line.scale ?? 1), coreDepositMinor: line.core ?? 0, stock: stock(),
        }
        ;(p as SeedPart & { describe?: (a: string) => string }).describe = line.describe
        parts.push(p)
        bySku.set(sku, p)
        c.skus.push(sku)
      }
    }
    if (!c.applications.includes(application)) c.applications.push(application)
    if (!c.oeMakes.has(make.make)) {
      c.oeMakes.add(make.make)
      const oe = make.oe(r)
      for (const sku of c.skus) bySku.get(sku)!.oe.push({ oeNumber: oe, maker: make.make })
    }
    return c.skus
  }

  let mismatchMcDone = false
  let mismatchCaliperDone = false

  for (const make of MAKES) {
    for (const model of make.models) {
      for (const gen of model.gens) {
        const isPennonMk2 = make.make === BORE_MISMATCH.caliper.make && model.name === BORE_MISMATCH.caliper.model && gen[0] === BORE_MISMATCH.caliper.generation
        const platform = platformFor(r, make, model, gen, isPennonMk2)
        if (isPennonMk2) {
          // the finder journey needs an option question with two disc sizes and the uprated caliper case
          platform.front[0] = { disc: { diameterMm: 280, thicknessMm: 25, minThicknessMm: 23, vented: true, heightMm: 40.5 }, caliper: { caliperType: 'floating', pistonCount: 1, pistonDiametersMm: [54] }, padDims: [132, 55, 19] }
          platform.front[1] = { disc: { diameterMm: 300, thicknessMm: 25, minThicknessMm: 23, vented: true, heightMm: 40.5 }, caliper: { caliperType: 'floating', pistonCount: 1, pistonDiametersMm: [57] }, padDims: [151, 62, 19.5] }
        }
        if (make.make === BORE_MISMATCH.masterCylinder.make && model.name === BORE_MISMATCH.masterCylinder.model) platform.mcBoreMm = BORE_MISMATCH.masterCylinder.oeBoreMm
        const app = `${make.make} ${model.name}`
        const engines = ENGINES[model.size]
        for (const [ei, engine] of engines.entries()) {
          const electric = engine.fuel === 'electric'
          const key = `${make.make}|${model.name}|${gen[0]}|${engine.code}`
          // which configurations this variant has: the middle variant usually offers both (an option question)
          const frontIdx = platform.front.length === 1 ? [0] : ei === 0 ? [0] : ei === 1 ? [0, 1] : [1]
          if (isPennonMk2) frontIdx.splice(0, frontIdx.length, 0, 1) // every Pennon Mk2 variant asks
          const rearKinds: ('disc' | 'drum')[] = platform.rearDisc && platform.rearDrum
            ? (ei === 0 ? ['drum'] : ei === 1 ? ['disc', 'drum'] : ['disc'])
            : platform.rearDisc ? ['disc'] : ['drum']
          const parkingKinds: ('cable' | 'electric')[] = !rearKinds.includes('disc') ? ['cable']
            : electric || gen[1] >= 2018 ? ['electric'] : ei === 1 || (model.size === 'large' && ei === 0) ? ['cable', 'electric'] : ['cable']
          const options: SeedOption[] = []
          if (frontIdx.length > 1) {
            const ds = frontIdx.map((i) => platform.front[i]!.disc.diameterMm)
            options.push({ key: 'front_disc_diameter_mm', label: 'Front disc diameter', question: `Front disc diameter: ${ds.map((d) => `${d} mm`).join(' or ')}? Measure across the disc face (or read the figure cast on the disc).`, values: ds.map((d) => ({ value: String(d), label: `${d} mm` })) })
          }
          if (rearKinds.length > 1) options.push({ key: 'rear_brake', label: 'Rear brakes', question: 'Disc or drum brakes at the rear? Look through the rear wheel.', values: [{ value: 'disc', label: 'Disc' }, { value: 'drum', label: 'Drum' }] })
          if (parkingKinds.length > 1) options.push({ key: 'parking_brake', label: 'Parking brake', question: 'Electric parking brake (a switch) or cable (a hand lever)?', values: [{ value: 'cable', label: 'Cable (hand lever)' }, { value: 'electric', label: 'Electric (switch)' }] })

          const q = (k: string, v: string): Record<string, string> => (options.some((o) => o.key === k) ? { [k]: v } : {})
          const brakes: SeedBrake[] = []
          for (const i of frontIdx) {
            const fc = platform.front[i]!
            brakes.push({ axle: 'front', qualifiers: q('front_disc_diameter_mm', String(fc.disc.diameterMm)), kind: 'disc', discDiameterMm: fc.disc.diameterMm, discThicknessMm: fc.disc.thicknessMm, discMinThicknessMm: fc.disc.minThicknessMm, discVented: fc.disc.vented, caliperType: fc.caliper.caliperType, pistonDiametersMm: fc.caliper.pistonDiametersMm, maxRunoutMm: 0.05, maxThicknessVariationMm: 0.015, padEdgeMarginMm: 2 })
          }
          if (rearKinds.includes('disc')) {
            const rc = platform.rearDisc!
            brakes.push({ axle: 'rear', qualifiers: q('rear_brake', 'disc'), kind: 'disc', discDiameterMm: rc.disc.diameterMm, discThicknessMm: rc.disc.thicknessMm, discMinThicknessMm: rc.disc.minThicknessMm, discVented: rc.disc.vented, caliperType: 'floating', pistonDiametersMm: rc.caliper.pistonDiametersMm, maxRunoutMm: 0.08, maxThicknessVariationMm: 0.02, padEdgeMarginMm: 1.5 })
          }
          if (rearKinds.includes('drum')) {
            const dc = platform.rearDrum!
            brakes.push({ axle: 'rear', qualifiers: q('rear_brake', 'drum'), kind: 'drum', drumDiameterMm: dc.diameterMm, drumMaxDiameterMm: dc.maxDiameterMm, wheelCylinderBoreMm: dc.wcBoreMm, maxRunoutMm: 0.1, drumShoeLayout: 'leading-trailing' })
          }
          const yearFrom = gen[1] + (ei === 2 && !electric ? 1 : 0)
          const kerbMassKg = platform.massKg + (electric ? 280 : engine.fuel === 'diesel' ? 60 : 0) + ei * 15
          const drive = electric && platform.drive === 'FWD' && model.size === 'large' ? 'RWD' : platform.drive
          const vehicle: SeedVehicle = {
            key, make: make.make, model: model.name, generation: gen[0], body: model.body, yearFrom, yearTo: gen[2],
            engineCode: `${make.make.slice(0, 2).toUpperCase()}-${engine.code}`, engineCc: engine.cc, fuel: engine.fuel, powerKw: engine.kw + between(r, -5, 5),
            // the demo's market drives on the left of the road: right-hand drive throughout
            drive, circuitSplit: platform.split, steeringSide: 'right',
            fluidGrade: model.size === 'small' && gen[1] < 2014 ? 'DOT 4' : pick(r, ['DOT 4', 'DOT 4', 'DOT 5.1']), tyreSize: platform.tyre,
            kerbMassKg,
            mcBoreMm: platform.mcBoreMm, mcTandem: true, mcStrokeMm: platform.mcStrokeMm, pedalRatio: platform.pedalRatio,
            boosterRatio: electric ? null : platform.boosterRatio, parkingBrake: parkingKinds[0]!,
            ...vehicleDynamics(model.size, model.body, drive, engine.fuel, kerbMassKg, yearFrom, !electric),
            options, brakes,
          }
          vehicles.push(vehicle)
          const fit = (skus: string[], axle: SeedFitment['axle'], side: SeedFitment['side'], quantity: number, qualifiers: Record<string, string>, note = '') => {
            for (const sku of skus) fitments.push({ vehicleKey: key, sku, axle, side, quantity, qualifiers, note })
          }

          // ---- front axle
          // with two disc sizes, calipers and pads depend on the answer only when the sizes use different calipers
          const sameCaliper = frontIdx.length > 1 && JSON.stringify([platform.front[frontIdx[0]!]!.caliper, platform.front[frontIdx[0]!]!.padDims]) === JSON.stringify([platform.front[frontIdx[1]!]!.caliper, platform.front[frontIdx[1]!]!.padDims])
          for (const [n, i] of frontIdx.entries()) {
            const fc = platform.front[i]!
            const fq = q('front_disc_diameter_mm', String(fc.disc.diameterMm))
            const d = fc.disc
            const discSpecs = { axle: 'front', diameterMm: d.diameterMm, thicknessMm: d.thicknessMm, minThicknessMm: d.minThicknessMm, heightMm: d.heightMm, centreBoreMm: make.hub.centreBoreMm, boltHoles: make.hub.boltHoles, pcdMm: make.hub.pcdMm, vented: d.vented }
            const lines = DISC_LINES.slice(0, d.diameterMm >= 300 ? 3 : 2).map((pl, li) => ({
              productLine: pl, specs: discSpecs, scale: 1 + li * 0.25,
              describe: (a: string) => `Front brake disc ${fmt(d.diameterMm)} × ${fmt(d.thicknessMm)} mm ${d.vented ? 'vented' : 'solid'}, ${make.hub.boltHoles} holes, ${pl}${li === 1 ? ' (coated hat and edge)' : li === 2 ? ' (slotted face)' : ''}, for ${a}`,
            }))
            fit(component('disc', JSON.stringify(discSpecs), lines, make, app), 'front', 'pair', 2, fq)
            if (sameCaliper && n > 0) continue
            const cq = sameCaliper ? {} : fq
            const shape = `PS-${make.make.slice(0, 1)}${fc.padDims.join('-').replace(/\./g, '')}`.slice(0, 16).toUpperCase()
            const cal = fc.caliper
            const calDesc = `${cal.caliperType === 'fixed' ? `fixed ${cal.pistonCount}-piston` : cal.pistonCount === 2 ? 'floating twin-piston' : 'floating single-piston'} ${cal.pistonDiametersMm.map(fmt).join('/')} mm`
            for (const side of ['left', 'right'] as const) {
              const specs = { position: `front-${side}`, caliperType: cal.caliperType, pistonCount: cal.pistonCount, pistonDiametersMm: cal.pistonDiametersMm, padShape: shape, parkingBrake: 'none', condition: 'new', coreDepositApplies: false }
              const skus = component('caliper', JSON.stringify({ ...specs, hub: make.make }), [
                { productLine: 'Carrick New', specs, describe: (a) => `Brake caliper front ${side}, ${calDesc}, new, for ${a}` },
                { productLine: 'Hollin Reman', specs: { ...specs, condition: 'remanufactured', coreDepositApplies: true }, scale: 0.6, core: between(r, 20, 45) * 100, suffix: 'R', describe: (a) => `Brake caliper front ${side}, ${calDesc}, remanufactured (exchange), for ${a}` },
              ], make, app)
              fit(skus, 'front', side, 1, cq)
              // the uprated caliper with a bigger piston than original equipment (for the bore-change check)
              if (isPennonMk2 && cal.pistonDiametersMm[0] === BORE_MISMATCH.caliper.oePistonMm) {
                const up = { ...specs, pistonDiametersMm: [BORE_MISMATCH.caliper.replacementPistonMm] }
                const upSkus = component('caliper', JSON.stringify({ ...up, uprated: true }), [
                  { productLine: BORE_MISMATCH.caliper.productLine, specs: up, scale: 1.2, describe: (a) => `Uprated brake caliper front ${side}, floating single-piston 57 mm (original 54 mm), new, for ${a}` },
                ], make, app)
                fit(upSkus, 'front', side, 1, cq, 'Piston 57 mm instead of the original 54 mm: more clamp force and fluid demand at the front. Check the bore change before fitting.')
                mismatchCaliperDone = true
              }
            }
            const [w, h, t] = fc.padDims
            const padSkus = component('pad_set', shape, PAD_LINES.map(([pl, code], li) => ({
              productLine: pl, scale: 1 + li * 0.2,
              specs: { axle: 'front', padShape: shape, widthMm: w, heightMm: h, thicknessMm: t, wearSensor: platform.padSensor, frictionCode: code, approvalMark: `E${pick(r, [1, 2, 4, 11])} 90R-02A1${digits(r, 4)}/${digits(r, 4)}` },
              describe: (a: string) => `Front pad set ${fmt(w)} × ${fmt(h)} × ${fmt(t)} mm, ${platform.padSensor === 'integrated' ? 'with wear sensor' : platform.padSensor === 'separate' ? 'sensor sold separately' : 'no wear sensor'}, ${pl} (${code}), for ${a}`,
            })), make, app)
            fit(padSkus, 'front', 'pair', 1, cq)
            fit(component('fitting_kit', `front|${shape}`, [{ productLine: 'Greywell Fit', specs: { axle: 'front', kitFor: 'pad_set', padShape: shape, pieces: between(r, 6, 14) }, describe: (a) => `Front pad fitting kit (clips, guide pins, boots) for pad shape ${shape}, for ${a}` }], make, app), 'front', 'pair', 1, cq)
          }
          if (platform.padSensor === 'separate') {
            const len = platform.sensorLengthMm
            fit(component('wear_sensor', `front|${len}|${make.make}`, [{ productLine: 'Greywell Signal', specs: { axle: 'front', lengthMm: len, connector: `${make.make.slice(0, 3).toUpperCase()} 2-pin` }, describe: (a) => `Front pad wear sensor ${len} mm lead, for ${a}` }], make, app), 'front', 'pair', 1, {})
          }
          // hoses: one per side at the front, a pair at the rear
          const hoseLen = platform.frontHoseMm
          for (const side of ['left', 'right'] as const) {
            fit(component('hose', `front-${side}|${hoseLen}|${make.make}`, [{ productLine: 'Carrick Flex', specs: { position: `front-${side}`, lengthMm: hoseLen, threadA: 'M10x1.0 male', threadB: 'M10x1.0 female' }, describe: (a) => `Brake hose front ${side} ${hoseLen} mm, M10x1.0, for ${a}` }], make, app), 'front', side, 1, {})
          }
          const rearHoseLen = platform.rearHoseMm
          fit(component('hose', `rear|${rearHoseLen}|${make.make}`, [{ productLine: 'Carrick Flex', specs: { position: 'rear-left', lengthMm: rearHoseLen, threadA: 'M10x1.0 male', threadB: '3/8-24 UNF female' }, describe: (a) => `Brake hose rear ${rearHoseLen} mm (either side), for ${a}` }], make, app), 'rear', 'pair', 2, {})

          // ---- rear axle: discs
          if (rearKinds.includes('disc')) {
            const rq = q('rear_brake', 'disc')
            const rc = platform.rearDisc!
            const d = rc.disc
            const discSpecs = { axle: 'rear', diameterMm: d.diameterMm, thicknessMm: d.thicknessMm, minThicknessMm: d.minThicknessMm, heightMm: d.heightMm, centreBoreMm: make.hub.centreBoreMm, boltHoles: make.hub.boltHoles, pcdMm: make.hub.pcdMm, vented: d.vented }
            fit(component('disc', JSON.stringify(discSpecs), DISC_LINES.slice(0, 2).map((pl, li) => ({
              productLine: pl, specs: discSpecs, scale: 0.85 + li * 0.2,
              describe: (a: string) => `Rear brake disc ${fmt(d.diameterMm)} × ${fmt(d.thicknessMm)} mm ${d.vented ? 'vented' : 'solid'}, ${make.hub.boltHoles} holes, ${pl}, for ${a}`,
            })), make, app), 'rear', 'pair', 2, rq)
            const shape = `PS-${make.make.slice(0, 1)}R${rc.padDims.join('-').replace(/\./g, '')}`.slice(0, 16).toUpperCase()
            const piston = rc.caliper.pistonDiametersMm[0]!
            for (const parking of parkingKinds) {
              for (const side of ['left', 'right'] as const) {
                const specs = { position: `rear-${side}`, caliperType: 'floating', pistonCount: 1, pistonDiametersMm: [piston], padShape: shape, parkingBrake: parking, condition: 'new', coreDepositApplies: false }
                const skus = component('caliper', JSON.stringify({ ...specs, hub: make.make }), [
                  { productLine: 'Carrick New', specs, scale: parking === 'electric' ? 1.5 : 0.8, describe: (a) => `Brake caliper rear ${side}, floating ${fmt(piston)} mm, ${parking === 'electric' ? 'with electric parking brake motor' : 'cable parking brake'}, new, for ${a}` },
                  { productLine: 'Hollin Reman', specs: { ...specs, condition: 'remanufactured', coreDepositApplies: true }, scale: parking === 'electric' ? 0.9 : 0.5, core: between(r, 20, 40) * 100, suffix: 'R', describe: (a) => `Brake caliper rear ${side}, floating ${fmt(piston)} mm, ${parking === 'electric' ? 'electric parking brake' : 'cable parking brake'}, remanufactured (exchange), for ${a}` },
                ], make, app)
                fit(skus, 'rear', side, 1, { ...rq, ...q('parking_brake', parking) })
              }
            }
            const [w, h, t] = rc.padDims
            fit(component('pad_set', shape, PAD_LINES.slice(0, 2).map(([pl, code], li) => ({
              productLine: pl, scale: 0.85 + li * 0.2,
              specs: { axle: 'rear', padShape: shape, widthMm: w, heightMm: h, thicknessMm: t, wearSensor: 'none', frictionCode: code },
              describe: (a: string) => `Rear pad set ${fmt(w)} × ${fmt(h)} × ${fmt(t)} mm, ${pl} (${code}), for ${a}`,
            })), make, app), 'rear', 'pair', 1, rq)
            fit(component('fitting_kit', `rear|${shape}`, [{ productLine: 'Greywell Fit', specs: { axle: 'rear', kitFor: 'pad_set', padShape: shape, pieces: between(r, 4, 10) }, describe: (a) => `Rear pad fitting kit for pad shape ${shape}, for ${a}` }], make, app), 'rear', 'pair', 1, rq)
          }
          // ---- rear axle: drums
          if (rearKinds.includes('drum')) {
            const rq = q('rear_brake', 'drum')
            const dc = platform.rearDrum!
            const drumSpecs = { axle: 'rear', diameterMm: dc.diameterMm, maxDiameterMm: dc.maxDiameterMm, widthMm: dc.widthMm, boltHoles: make.hub.boltHoles }
            fit(component('drum', JSON.stringify({ ...drumSpecs, hub: make.make }), ['Greywell Standard', 'Greywell Coated'].map((pl, li) => ({
              productLine: pl, specs: drumSpecs, scale: 1 + li * 0.2,
              describe: (a: string) => `Rear brake drum ${fmt(dc.diameterMm)} mm (max ${fmt(dc.maxDiameterMm)} mm), ${pl}, for ${a}`,
            })), make, app), 'rear', 'pair', 2, rq)
            fit(component('shoe_set', `${dc.diameterMm}|${dc.widthMm}`, SHOE_LINES.map(([pl, code], li) => ({
              productLine: pl, scale: 1 + li * 0.2,
              specs: { axle: 'rear', diameterMm: dc.diameterMm, widthMm: dc.widthMm, frictionCode: code, parkingLever: true },
              describe: (a: string) => `Rear brake shoe set ${fmt(dc.diameterMm)} × ${fmt(dc.widthMm)} mm with parking lever, ${pl} (${code}), for ${a}`,
            })), make, app), 'rear', 'pair', 1, rq)
            fit(component('wheel_cylinder', `${dc.wcBoreMm}|${make.make}`, [{ productLine: 'Carrick New', specs: { axle: 'rear', boreMm: dc.wcBoreMm, side: 'pair' }, describe: (a) => `Rear wheel cylinder ${fmt(dc.wcBoreMm)} mm bore (either side), for ${a}` }], make, app), 'rear', 'pair', 2, rq)
            fit(component('fitting_kit', `shoes|${dc.diameterMm}|${make.make}`, [{ productLine: 'Greywell Fit', specs: { axle: 'rear', kitFor: 'shoe_set', pieces: between(r, 10, 24) }, describe: (a) => `Rear shoe fitting kit ${fmt(dc.diameterMm)} mm (springs, pins, adjuster), for ${a}` }], make, app), 'rear', 'pair', 1, rq)
          }
          // ---- whole vehicle: master cylinder and fluid
          const bore = platform.mcBoreMm
          const ports = platform.split === 'diagonal' ? 4 : 2
          const mcSpecs = { boreMm: bore, tandem: true, ports, reservoir: 'integrated', condition: 'new', coreDepositApplies: false }
          fit(component('master_cylinder', JSON.stringify({ ...mcSpecs, make: make.make }), [
            { productLine: 'Carrick New', specs: mcSpecs, describe: (a) => `Master cylinder tandem ${fmt(bore)} mm bore, ${ports} ports, with reservoir, new, for ${a}` },
            { productLine: 'Hollin Reman', specs: { ...mcSpecs, condition: 'remanufactured', coreDepositApplies: true }, scale: 0.6, core: between(r, 25, 40) * 100, suffix: 'R', describe: (a) => `Master cylinder tandem ${fmt(bore)} mm bore, ${ports} ports, remanufactured (exchange), for ${a}` },
          ], make, app), 'all', 'pair', 1, {})
          if (make.make === BORE_MISMATCH.masterCylinder.make && model.name === BORE_MISMATCH.masterCylinder.model) {
            const up = { ...mcSpecs, boreMm: BORE_MISMATCH.masterCylinder.replacementBoreMm }
            fit(component('master_cylinder', JSON.stringify({ ...up, uprated: true }), [
              { productLine: BORE_MISMATCH.masterCylinder.productLine, specs: up, scale: 1.25, describe: (a) => `Uprated master cylinder tandem 25.40 mm (1 in) bore, original 22.22 mm, ${ports} ports, new, for ${a}` },
            ], make, app), 'all', 'pair', 1, {}, 'Bore 25.40 mm instead of the original 22.22 mm: less pressure per pedal force, shorter pedal travel. Check the bore change before fitting.')
            mismatchMcDone = true
          }
        }
      }
    }
  }

  // fluid: every vehicle takes its own grade
  const fluidSkus: Record<string, string[]> = {}
  for (const [grade, vols] of [['DOT 3', [500]], ['DOT 4', [500, 1000, 5000]], ['DOT 5.1', [500, 1000]]] as const) {
    fluidSkus[grade] = []
    for (const ml of vols) {
      const sku = nextSku('fluid')
      const scale = ml / 1000
      const p: SeedPart = {
        sku, type: 'fluid', productLine: 'Marram Fluid', status: 'active', oe: [], specs: { grade, volumeMl: ml },
        description: `Brake fluid ${grade}, ${ml >= 1000 ? `${ml / 1000} L` : `${ml} ml`}, sealed bottle`,
        ...price(1300, Math.max(0.5, scale * 0.8 + 0.2)), coreDepositMinor: 0, stock: stock(),
      }
      parts.push(p)
      bySku.set(sku, p)
      fluidSkus[grade].push(sku)
    }
  }
  for (const v of vehicles) {
    for (const sku of (fluidSkus[v.fluidGrade] ?? [])) fitments.push({ vehicleKey: v.key, sku, axle: 'all', side: 'pair', quantity: 1, qualifiers: {}, note: '' })
  }

  // descriptions name the first applications of each component
  for (const c of components.values()) {
    const apps = c.applications.slice(0, 2).join(', ') + (c.applications.length > 2 ? ' and others' : '')
    for (const sku of c.skus) {
      const p = bySku.get(sku)! as SeedPart & { describe?: (a: string) => string }
      p.description = p.describe!(apps)
      delete p.describe
    }
  }

  // supersessions: a few parts replaced a former SKU (some kept as discontinued rows, some only as numbers)
  const candidates = parts.filter((p) => ['pad_set', 'disc', 'caliper', 'master_cylinder', 'hose'].includes(p.type) && p.status === 'active')
  for (let i = 0; i < 16; i++) {
    const p = candidates[Math.floor((i * 37 + 11) % candidates.length)]!
    if (supersessions.some((s) => s.newSku === p.sku)) continue
    const oldSku = `${p.sku.split('-')[0]}-${8000 + i * 7}`
    const why = pick(r, ['revised shim and chamfer', 'new casting supplier', 'improved corrosion coating', 'revised bracket bolts', 'new seal material'])
    supersessions.push({ oldSku, newSku: p.sku, note: `${oldSku} was replaced by ${p.sku}: ${why}. Fits the same vehicles.` })
    if (i % 2 === 0) {
      parts.push({ ...p, sku: oldSku, status: 'discontinued', oe: [], description: `${p.description} (discontinued)`, stock: { NGT: 0, RVS: 0 } })
    }
  }

  if (!mismatchMcDone || !mismatchCaliperDone) throw new Error('catalogue seed: the declared bore-mismatch pairs were not generated')
  return { vehicles, parts, fitments, supersessions }
}

/** OE numbers compare without spaces, dashes, dots and slashes, in capitals. */
export const normaliseOe = normaliseIdentifier

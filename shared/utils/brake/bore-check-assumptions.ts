/**
 * What a bore check's figures rest on, beyond the chain's own assumptions: the defaults this input called for and
 * the sources of the vehicle figures, so every figure keeps its assumptions beside it.
 */
import type { HydraulicsInput } from './schemas'
import type { BrakeSystem, ChainResult } from './hydraulics'
import { DEFAULT_PISTON_TRAVEL_MM } from './hydraulics'
import { TYRE_RADIUS_ASSUMPTION } from './units'
import { DEFAULT_EDGE_MARGIN_MM, ESTIMATED_PAD_HEIGHT_SHARE } from './effective-radius'
import { SHOE_LAYOUT_BRAKE_FACTORS, SHOE_LAYOUT_NAMES } from './shoe-layouts'
import type { ResolvedReplacement } from './bore-check-systems'

interface Side { system: BrakeSystem; chain: ChainResult }

function usesTyreSize(system: BrakeSystem): boolean {
  return [system.axles.front, system.axles.rear].some((a) => a.tyreRollingRadiusMm === undefined && a.tyreSize !== undefined)
}

function axleNotes(chains: ChainResult[]): string[] {
  const axles = chains.flatMap((c) => [c.axles.front, c.axles.rear])
  const out: string[] = []
  if (axles.some((a) => a.effectiveRadiusSource === 'pad-uniform-wear')) {
    out.push(
      'Disc effective radius from the pad: outer radius = disc radius − edge margin, inner radius = outer − the pad\'s radial height; ' +
      'the uniform-wear mean radius (Ro + Ri) / 2 of a bedded pad (Budynas & Nisbett, Shigley\'s Mechanical Engineering Design, §16-5). ' +
      'A new pad presses evenly and acts a little further out (the uniform-pressure radius, shown beside it). A typed-in effective radius wins.',
    )
  }
  if (axles.some((a) => a.padSweep?.edgeMarginSource === 'default' && a.effectiveRadiusSource === 'pad-uniform-wear')) {
    out.push(`Edge margin ${DEFAULT_EDGE_MARGIN_MM} mm between the disc's edge and the pad's where neither the vehicle nor the part data gives one (common practice: 1-3 mm).`)
  }
  if (axles.some((a) => a.padSweep?.padHeightSource === 'estimated' && a.effectiveRadiusSource === 'pad-uniform-wear')) {
    out.push(`Pad height ${ESTIMATED_PAD_HEIGHT_SHARE} × the disc diameter where no pad data is known (common practice estimate).`)
  }
  if (axles.some((a) => a.pistonTravelSource === 'default')) {
    out.push(`Piston travel not given: ${DEFAULT_PISTON_TRAVEL_MM.disc} mm per disc piston, ${DEFAULT_PISTON_TRAVEL_MM.drum} mm per drum wheel-cylinder piston (common practice estimate).`)
  }
  const layouts = [...new Set(axles.map((a) => a.brakeFactorSource).filter((s): s is Exclude<typeof s, 'given' | null> => s !== null && s !== 'given'))]
  for (const layout of layouts) {
    out.push(`Drum brake factor ${SHOE_LAYOUT_BRAKE_FACTORS[layout]} for ${SHOE_LAYOUT_NAMES[layout]} where none was typed in (typical at a lining friction of about 0.38, as Limpert's Brake Design and Safety and the Bosch Automotive Handbook give them).`) // the figures from memory of those books
  }
  return out
}

function vehicleNotes(input: HydraulicsInput, chains: ChainResult[]): string[] {
  const out: string[] = []
  if (input.boosterRatio > 1) {
    out.push(input.boosterRunOutKPa !== undefined
      ? `Booster run-out (knee) at ${input.boosterRunOutKPa} kPa: below it P = F_in × boost / A; above it P = P_ro + (F_in − P_ro × A / boost) / A.`
      : 'No booster run-out pressure given: the booster is taken as a fixed ratio at any pedal force, which overstates pressure past its knee.')
  }
  if (input.tyreRoadFriction === undefined && chains.some((c) => c.decelerationMps2 !== null)) {
    out.push(`Tyre-road friction ${chains[0]!.tyreRoadFriction} (dry asphalt, common practice) where none was given: the deceleration never exceeds it.`)
  }
  const v = input.vehicle
  if (!v) {
    out.push('No vehicle data (mass, wheelbase, centre of gravity height, static front share): no adhesion utilisation or order of locking is worked out.')
    return out
  }
  out.push(
    'Dynamic axle loads with the load transfer z × h / L; adhesion utilisation f = axle braking force / dynamic axle load; the axle that needs more friction locks first (UN ECE Regulation 13-H, Annex 5).',
  )
  if (v.rearValve) {
    out.push(`Rear valve: rear pressure follows the master cylinder up to ${v.rearValve.kneeKPa} kPa${v.rearValve.ladenKneeKPa !== undefined ? ` (${v.rearValve.ladenKneeKPa} kPa laden)` : ''}, then rises ${v.rearValve.slope} × as fast.`)
  } else {
    out.push('No rear valve in the data: every wheel sees the same line pressure.')
  }
  if (v.electronicDistribution) {
    out.push('Electronic brake-force distribution is fitted: while the ABS works it keeps the rear below locking; the figures here are the hydraulic balance without it.')
  }
  if (!v.laden) out.push('Only the unladen state is known: the order of locking and the service stop are judged unladen only.')
  return out
}

/** Assumptions the input called for (the chain's own come first, in CHAIN_ASSUMPTIONS). */
export function hydraulicsAssumptions(input: HydraulicsInput, original: Side, rep: (Side & { resolved: ResolvedReplacement }) | null): string[] {
  const chains = rep ? [original.chain, rep.chain] : [original.chain]
  const out: string[] = []
  if (usesTyreSize(original.system) || (rep && usesTyreSize(rep.system))) out.push(TYRE_RADIUS_ASSUMPTION)
  if (chains.some((c) => c.shareBasis === 'torque')) {
    out.push('Front/rear share from brake torque where a rolling radius is missing (equal tyre radii front and rear).')
  }
  out.push(...axleNotes(chains), ...vehicleNotes(input, chains))
  if (rep && rep.resolved.inherited.length > 0) {
    out.push(`Replacement values not given were taken from the original: ${rep.resolved.inherited.map(inheritedWords).join(', ')}.`)
  }
  out.push(
    'Stopping distances from 100 km/h are written as FMVSS No. 135 writes its limits: 0.10 V + V² / (25.92 a), the 0.10 V build-up term on both sides; the service stop (S7.5) is compared at its 500 N pedal force in each load state.',
    'Circuit failure: the intact circuit reaches the same line pressure as before; the wheels still braking can use only the friction of the load on them.',
  )
  return out
}

/** What a figure taken from the original is called where people read it (the paths stay in `resolved.inherited`). */
const INHERITED_WORDS: Record<string, string> = {
  strokeMm: 'master cylinder stroke', tandem: 'tandem or single master cylinder', ports: 'master cylinder ports', portLayout: 'port layout',
  tyreRollingRadiusMm: 'tyre rolling radius', tyreSize: 'tyre size', pistonTravelMm: 'piston travel', padHeightMm: 'pad height', edgeMarginMm: 'pad edge margin',
}
function inheritedWords(path: string): string {
  const [group, a, b] = path.split('.')
  return group === 'masterCylinder' ? INHERITED_WORDS[a!] ?? a! : `${a} ${INHERITED_WORDS[b!] ?? b}`
}

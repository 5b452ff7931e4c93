/**
 * Findings about grip, balance and stopping: the deceleration the tyres cap, which axle locks first at the
 * operating deceleration, the order of locking against UN ECE Regulation 13-H Annex 5 in every load state, the
 * FMVSS No. 135 service stop at 500 N in each load state, and what is left when a circuit fails.
 */
import type { CircuitFailureResult } from './circuit'
import type { ChainResult } from './hydraulics'
import type { VehicleData } from './schemas'
import type { LoadStateOrder } from './locking-order'
import type { ServiceStop } from './service-stop'
import { FMVSS_135 } from './stopping'
import type { BoreCheckFinding } from './bore-check-findings'

const fmt = (n: number, digits = 1) => n.toFixed(digits)
const z2 = (z: number) => z.toFixed(2)

/** "rear above front from z = 0.55 to 0.80 laden" for the stretches that break the band. */
function stretchText(orders: readonly LoadStateOrder[]): string {
  return orders
    .filter((o) => !o.meets)
    .map((o) => `${o.rearFirst.filter((s) => !s.tolerated).map((s) => `z = ${z2(s.fromZ)} to ${z2(s.toZ)}`).join(' and ')} ${o.loadState} (${o.massKg} kg)`)
    .join('; ')
}

const EBD_NOTE = ' The vehicle has electronic brake-force distribution: it holds the rear below locking while the ABS works, but with an ABS fault this hydraulic balance is all there is.'

/**
 * Deceleration capped by grip, and the axle that locks first at the operating deceleration. With electronic
 * distribution fitted the rear locking first is a note; without it a warning, and a danger when the replacement
 * turns an original that locked the front first.
 */
export function gripFindings(chain: ChainResult, pedalForceN: number, who: 'original' | 'replacement', vehicle?: VehicleData, baseline?: ChainResult): BoreCheckFinding[] {
  const findings: BoreCheckFinding[] = []
  if (chain.decelerationLimitedBy === 'tyre grip' && chain.brakeDecelerationMps2 !== null && chain.decelerationMps2 !== null) {
    findings.push({
      severity: 'info',
      code: 'grip-limited',
      message:
        `At ${fmt(pedalForceN, 0)} N pedal force the ${who} brakes could give ${fmt(chain.brakeDecelerationMps2, 2)} m/s², more than tyres on a road with friction ${chain.tyreRoadFriction} can hold: ` +
        `the deceleration is ${fmt(chain.decelerationMps2, 2)} m/s² at most, and without ABS the ${chain.adhesion?.locksFirst === 'rear' ? 'rear' : 'front'} wheels lock first.`,
    })
  }
  const a = chain.adhesion
  if (a && a.locksFirst === 'rear' && chain.decelerationMps2 !== null) {
    findings.push({
      severity: vehicle?.electronicDistribution ? 'info' : baseline && baseline.adhesion?.locksFirst !== 'rear' ? 'danger' : 'warning',
      code: 'rear-locks-first',
      message:
        `At ${fmt(chain.decelerationMps2, 2)} m/s² the ${who} system asks the rear tyres for friction ${fmt(a.rear, 2)} and the front for ${fmt(a.front, 2)}: ` +
        `the rear wheels would lock first, which can spin the vehicle.${vehicle?.electronicDistribution ? EBD_NOTE : ''}`,
    })
  }
  return findings
}

/** The original's order of locking against the UN ECE R13-H Annex 5 band. */
export function lockingOrderFindings(orders: readonly LoadStateOrder[] | null, vehicle?: VehicleData): BoreCheckFinding[] {
  if (!orders || orders.every((o) => o.meets)) return []
  return [{
    severity: vehicle?.electronicDistribution ? 'info' : 'warning',
    code: 'locking-order-outside',
    message:
      `With the original figures the rear axle needs more grip than the front at ${stretchText(orders)}: outside UN ECE Regulation 13-H Annex 5 (front above rear from z = 0.15 to 0.80 in every load state). ` +
      `Check the figures, the rear valve data and the vehicle maker's data.${vehicle?.electronicDistribution ? EBD_NOTE : ''}`,
  }]
}

/** What the replacement does to the order of locking. */
export function lockingOrderChange(original: readonly LoadStateOrder[] | null, replacement: readonly LoadStateOrder[] | null, vehicle?: VehicleData): BoreCheckFinding[] {
  if (!original || !replacement) return []
  const before = original.every((o) => o.meets)
  const after = replacement.every((o) => o.meets)
  if (before && !after) {
    return [{
      severity: vehicle?.electronicDistribution ? 'warning' : 'danger',
      code: 'locking-order-worse',
      message:
        `With the replacement the rear axle needs more grip than the front at ${stretchText(replacement)}: the set-up leaves UN ECE Regulation 13-H Annex 5's band (front above rear from z = 0.15 to 0.80 in every load state), ` +
        `so in a hard stop the rear wheels lock first and the vehicle can spin. Don't fit it without the vehicle maker's approval.${vehicle?.electronicDistribution ? EBD_NOTE : ''}`,
    }]
  }
  if (!before && after) {
    return [{ severity: 'info', code: 'locking-order-better', message: 'With the replacement the front axle stays above the rear from z = 0.15 to 0.80 in every load state (UN ECE Regulation 13-H Annex 5).' }]
  }
  return []
}

/** The FMVSS No. 135 service stop at 500 N in each load state, and circuit failure. */
export function stoppingFindings(stops: readonly ServiceStop[], failures: CircuitFailureResult[], who: 'original' | 'replacement'): BoreCheckFinding[] {
  const findings: BoreCheckFinding[] = []
  const ref = FMVSS_135.service
  for (const s of stops) {
    if (s.meets) continue
    findings.push({
      severity: 'danger',
      code: 'service-stop-long',
      message:
        `With ${ref.maxPedalForceN} N on the pedal, ${s.loadState} (${s.massKg} kg), the ${who} system gives ${fmt(s.decelerationMps2, 2)} m/s²${s.limitedBy === 'tyre grip' ? ' (tyre grip)' : ''}: ` +
        `a stop from 100 km/h of ${fmt(s.distanceM, 0)} m, more than the ${ref.distanceM} m of FMVSS No. 135 S7.5 (0.10 V + 0.0060 V², the 0.10 V build-up term counted on both sides).`,
    })
  }
  for (const f of failures) {
    if (f.meetsReference === false) {
      findings.push({
        severity: 'warning',
        code: 'circuit-failure-short',
        message:
          `${f.label} (${who}): ${fmt(f.remainingSharePercent)} % of the braking remains, a stop from 100 km/h of ` +
          `${fmt(f.stoppingDistanceFrom100KmhM ?? 0, 0)} m, more than the ${f.reference.distanceM} m partial-failure figure (FMVSS No. 135 S7.10).`,
      })
    }
  }
  return findings
}

/**
 * Drum brake factors by shoe layout. The brake factor C* is the drag of both shoes on the drum divided by the
 * force of one wheel-cylinder piston; it grows with the lining's friction coefficient and with how much the
 * shoes are self-energising. Typical values at a lining friction coefficient of about 0.38, from memory of the
 * brake-factor curves in Limpert, Brake Design and Safety (ch. 2) and the Bosch Automotive Handbook: a
 * leading/trailing (simplex) brake about 2.0, a two-leading-shoe (duplex) brake about 3.0, a duo-servo brake
 * about 5.0. The maker's own figure, typed in, always wins.
 */
import type { ShoeLayout } from './schemas'

export const SHOE_LAYOUT_BRAKE_FACTORS: Readonly<Record<ShoeLayout, number>> = {
  'leading-trailing': 2.0,
  'two-leading': 3.0,
  'duo-servo': 5.0,
}

export const SHOE_LAYOUT_NAMES: Readonly<Record<ShoeLayout, string>> = {
  'leading-trailing': 'leading/trailing shoes',
  'two-leading': 'two leading shoes',
  'duo-servo': 'duo-servo shoes',
}

/** Layout assumed when neither a brake factor nor a layout is given (the commonest rear drum). */
export const DEFAULT_SHOE_LAYOUT: ShoeLayout = 'leading-trailing'

/** The brake factor to use and where it came from. */
export function drumBrakeFactor(axle: { brakeFactor?: number; shoeLayout?: ShoeLayout }): { factor: number; source: 'given' | ShoeLayout; layoutGiven: boolean } {
  if (axle.brakeFactor !== undefined) return { factor: axle.brakeFactor, source: 'given', layoutGiven: axle.shoeLayout !== undefined }
  const layout = axle.shoeLayout ?? DEFAULT_SHOE_LAYOUT
  return { factor: SHOE_LAYOUT_BRAKE_FACTORS[layout], source: layout, layoutGiven: axle.shoeLayout !== undefined }
}

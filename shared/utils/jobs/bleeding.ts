/**
 * The order to bleed the brakes in, by the vehicle's circuit split. Common practice (workshop manuals and fluid
 * makers' instructions): start at the wheel farthest from the master cylinder and work towards it, so the longest
 * pipe run is cleared first; on a diagonal split, bleed one circuit (its rear wheel, then its front) and then the
 * other, starting with the circuit whose rear wheel is farthest away. The master cylinder sits on the driver's
 * side of the bulkhead: right-hand drive puts it on the right. ABS units may need their own routine: the
 * vehicle maker's sequence always comes first.
 */
export type Wheel = 'left rear' | 'right rear' | 'left front' | 'right front'
export type CircuitSplit = 'front-rear' | 'diagonal'

export function bleedingSequence(split: CircuitSplit, masterCylinderSide: 'left' | 'right' = 'right'): Wheel[] {
  const far = masterCylinderSide === 'right' ? 'left' : 'right'
  const near = masterCylinderSide
  if (split === 'diagonal') return [`${far} rear`, `${near} front`, `${near} rear`, `${far} front`]
  return [`${far} rear`, `${near} rear`, `${far} front`, `${near} front`]
}

export const CIRCUIT_SPLIT_LABELS: Record<CircuitSplit, string> = {
  'front-rear': 'front/rear split (one circuit per axle)',
  diagonal: 'diagonal split (each circuit one front and the opposite rear wheel)',
}

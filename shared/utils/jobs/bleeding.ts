/**
 * The order to bleed the brakes in, by the vehicle's circuit split. Common practice (workshop manuals and fluid
 * makers' instructions): start at the wheel farthest from the master cylinder and work towards it, so the longest
 * pipe run is cleared first; on a diagonal split, bleed one circuit (its rear wheel, then its front) and then the
 * other, starting with the circuit whose rear wheel is farthest away. The master cylinder sits on the driver's
 * side of the bulkhead: right-hand drive puts it on the right, left-hand drive on the left. ABS units may need their own routine: the
 * vehicle maker's sequence always comes first.
 */
export type Wheel = 'left rear' | 'right rear' | 'left front' | 'right front'
export type CircuitSplit = 'front-rear' | 'diagonal'

export function bleedingSequence(split: CircuitSplit, masterCylinderSide: 'left' | 'right'): Wheel[] {
  const far = masterCylinderSide === 'right' ? 'left' : 'right'
  const near = masterCylinderSide
  if (split === 'diagonal') return [`${far} rear`, `${near} front`, `${near} rear`, `${far} front`]
  return [`${far} rear`, `${near} rear`, `${far} front`, `${near} front`]
}

/**
 * The bleeding order for a vehicle as catalogued: none when its steering side (so the master cylinder's side) is
 * not recorded, since guessing it would start at the wrong wheel on a car built for the other side of the road.
 */
export function vehicleBleedingSequence(split: CircuitSplit | null, steeringSide: 'left' | 'right' | null): Wheel[] {
  return split && steeringSide ? bleedingSequence(split, steeringSide) : []
}

export const BLEEDING_SIDE_UNKNOWN = 'The vehicle\'s steering side is not recorded, so no order is given: start at the wheel farthest from the master cylinder and work towards it, or follow the vehicle maker\'s sequence.'

export const CIRCUIT_SPLIT_LABELS: Record<CircuitSplit, string> = {
  'front-rear': 'front/rear split (one circuit per axle)',
  diagonal: 'diagonal split (each circuit one front and the opposite rear wheel)',
}

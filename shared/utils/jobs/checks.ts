/** The checks a technician ticks before signing a brake job off (common practice after brake work). */
export const JOB_CHECKS = [
  { key: 'pedal', label: 'Pedal firm and high; it does not sink under steady pressure with the engine running' },
  { key: 'fluid_level', label: 'Fluid level at MAX with the pistons pushed home; reservoir cap tight' },
  { key: 'wheel_fixings', label: 'Wheel fixings tightened to the torque above' },
  { key: 'bedding_in', label: 'New pads and discs bedded in: moderate stops from about 50 km/h, no standing on hot brakes' },
  { key: 'road_test', label: 'Road test: straight stops with no pull or noise; parking brake holds' },
] as const
export type JobCheckKey = (typeof JOB_CHECKS)[number]['key']
export const JOB_CHECK_KEYS = JOB_CHECKS.map((c) => c.key) as [JobCheckKey, ...JobCheckKey[]]

export const JOB_CARD_CAUTION = 'Follow the vehicle maker\'s figures and bleeding routine where they differ from these (ABS units may need their own). Do not hand the car back until the pedal is firm and the road test is passed.'

/** The axles of a car: the one name for them everywhere (brake data, fitment, search, calculations, inspections). */
export const AXLES = ['front', 'rear'] as const
export type AxleName = (typeof AXLES)[number]

/** Where a part fits: one axle, or the whole car (fluid, master cylinder). */
export const FITMENT_AXLES = ['front', 'rear', 'all'] as const
export type FitmentAxle = (typeof FITMENT_AXLES)[number]

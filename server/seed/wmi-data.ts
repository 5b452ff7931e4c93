/**
 * World manufacturer identifiers (VIN positions 1-3) of the demo catalogue's invented makes. Invented codes for
 * invented makers, in the regions ISO 3780 gives their first character (S-Z Europe, 1-5 North America); one
 * North American plant so the demo shows a check digit that is compulsory.
 */
export interface SeedWmi { wmi: string; make: string; country: string }

export const DEMO_WMIS: readonly SeedWmi[] = [
  { wmi: 'SVT', make: 'Veltra', country: 'United Kingdom' },
  { wmi: 'WK3', make: 'Kaskel', country: 'Germany' },
  { wmi: '5KK', make: 'Kaskel', country: 'United States' },
  { wmi: 'VD7', make: 'Durmond', country: 'France' },
  { wmi: 'YL4', make: 'Lystrom', country: 'Sweden' },
  { wmi: 'SBR', make: 'Brenmoor', country: 'United Kingdom' },
  { wmi: 'ZT8', make: 'Taviro', country: 'Italy' },
  { wmi: 'VQ2', make: 'Quillan', country: 'Spain' },
]

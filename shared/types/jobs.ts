/** Answers of the job card routes and the labour guide. */
import type { Wheel } from '../utils/jobs/bleeding'

export interface Torque { what: string; nm: number }
export interface JobCheck { key: string; label: string; done: boolean }

export interface JobCardLine {
  id: number
  kind: string
  description: string
  sku: string | null
  quantity: number
  hours: number | null
  reason: string | null
  /** approved by the owner, or declined by the owner (listed so the technician does not fit it) */
  decision: 'approved' | 'declined'
}

export interface JobCardWheelGroup { where: string; label: string; lines: JobCardLine[] }

export interface JobCardView {
  quoteId: number
  reference: string
  vehicle: string
  registration: string
  odometerAtQuote: string
  /** the unit of the odometer readings (the one written at the quote; miles when it gave none) */
  odometerUnit: 'mi' | 'km'
  groups: JobCardWheelGroup[]
  declined: JobCardLine[]
  torques: Torque[]
  fluid: { grade: string; capacityMl: number | null }
  circuitSplit: 'front-rear' | 'diagonal' | null
  circuitSplitLabel: string
  /** the steering wheel's side (so the master cylinder's); null: not recorded, and no bleeding order given */
  steeringSide: 'left' | 'right' | null
  bleedingSequence: Wheel[]
  checks: JobCheck[]
  signedOff: { by: string; at: string; odometer: number | null } | null
  invoiceId: number | null
  caution: string
}

export interface LabourTimeView {
  vehicleId: number
  operation: string
  label: string
  hours: number
  /** 'guide': the distributor's guide; 'garage': the caller's garage's own hours */
  source: 'guide' | 'garage'
  guideHours: number | null
}

export interface AlsoNeeded { sku: string; relation: string; quantity: number; reason: string; description: string; fits: boolean | null }

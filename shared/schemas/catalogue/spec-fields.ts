/**
 * How each part type's specification fields read for people: label, unit and kind, in display order. One table
 * for the part page and the upkeep form, so a field never shows without its unit.
 */
import { AXLES } from '../../types/axles'
import { CONDITIONS, FLUID_GRADES, POSITIONS, SIDES, type PartType } from './part-types'

export interface SpecField {
  key: string
  label: string
  unit?: 'mm' | 'ml'
  kind: 'number' | 'integer' | 'boolean' | 'choice' | 'text' | 'numbers'
  choices?: readonly string[]
  optional?: boolean
}

const f = (key: string, label: string, kind: SpecField['kind'], extra: Partial<SpecField> = {}): SpecField => ({ key, label, kind, ...extra })
const mmField = (key: string, label: string) => f(key, label, 'number', { unit: 'mm' })
const axleField = f('axle', 'Axle', 'choice', { choices: AXLES })
const conditionFields = [f('condition', 'Condition', 'choice', { choices: CONDITIONS }), f('coreDepositApplies', 'Core deposit charged', 'boolean')]

export const SPEC_FIELDS: Record<PartType, SpecField[]> = {
  disc: [axleField, mmField('diameterMm', 'Diameter'), mmField('thicknessMm', 'Thickness'), mmField('minThicknessMm', 'Minimum thickness'),
    mmField('heightMm', 'Height'), mmField('centreBoreMm', 'Centre bore'), f('boltHoles', 'Bolt holes', 'integer'), mmField('pcdMm', 'Bolt circle'),
    f('vented', 'Vented', 'boolean')],
  pad_set: [axleField, f('padShape', 'Pad shape', 'text'), mmField('widthMm', 'Width'), mmField('heightMm', 'Height'), mmField('thicknessMm', 'Thickness'),
    f('wearSensor', 'Wear sensor', 'choice', { choices: ['none', 'integrated', 'separate'] }), f('frictionCode', 'Friction code (SAE J866)', 'text'),
    f('approvalMark', 'Approval mark', 'text', { optional: true })],
  caliper: [f('position', 'Position', 'choice', { choices: POSITIONS }), f('caliperType', 'Type', 'choice', { choices: ['fixed', 'floating'] }),
    f('pistonCount', 'Pistons', 'integer'), f('pistonDiametersMm', 'Piston diameter', 'numbers', { unit: 'mm' }), f('padShape', 'Pad shape', 'text'),
    f('parkingBrake', 'Parking brake', 'choice', { choices: ['none', 'cable', 'electric'] }),
    f('mountingCentresMm', 'Mounting bolt centres', 'number', { unit: 'mm', optional: true }), f('hoseThread', 'Hose thread', 'text', { optional: true }), ...conditionFields],
  drum: [axleField, mmField('diameterMm', 'Diameter'), mmField('maxDiameterMm', 'Maximum diameter'), mmField('widthMm', 'Width'), f('boltHoles', 'Bolt holes', 'integer')],
  shoe_set: [axleField, mmField('diameterMm', 'Drum diameter'), mmField('widthMm', 'Lining width'), f('frictionCode', 'Friction code (SAE J866)', 'text'),
    f('parkingLever', 'Parking lever', 'boolean')],
  wheel_cylinder: [axleField, mmField('boreMm', 'Bore'), f('side', 'Side', 'choice', { choices: SIDES })],
  hose: [f('position', 'Position', 'choice', { choices: POSITIONS }), mmField('lengthMm', 'Length'), f('threadA', 'Thread A', 'text'), f('threadB', 'Thread B', 'text')],
  fitting_kit: [axleField, f('kitFor', 'Kit for', 'choice', { choices: ['pad_set', 'shoe_set'] }), f('padShape', 'Pad shape', 'text', { optional: true }), f('pieces', 'Pieces', 'integer')],
  wear_sensor: [axleField, mmField('lengthMm', 'Length'), f('connector', 'Connector', 'text')],
  master_cylinder: [mmField('boreMm', 'Bore'), f('tandem', 'Tandem', 'boolean'), f('ports', 'Ports', 'integer'),
    f('reservoir', 'Reservoir', 'choice', { choices: ['integrated', 'remote', 'none'] }),
    f('mountingCentresMm', 'Mounting flange centres', 'number', { unit: 'mm', optional: true }), ...conditionFields],
  fluid: [f('grade', 'Grade', 'choice', { choices: FLUID_GRADES }), f('volumeMl', 'Volume', 'integer', { unit: 'ml' })],
}

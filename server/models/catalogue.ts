/**
 * Catalogue models. JSON columns (`specs`, `qualifiers`, `values`, `pistonDiametersMm`) are stored as text and
 * exposed parsed through getters/setters, validated by the zod schemas in shared/schemas before writing.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { jsonColumn } from './json-column'
import type { AxleName } from '../../shared/types/axles'


export type Qualifiers = Record<string, string>

export class Vehicle extends Model<InferAttributes<Vehicle>, InferCreationAttributes<Vehicle>> {
  declare id: CreationOptional<number>
  declare make: string
  declare model: string
  declare generation: CreationOptional<string>
  declare body: CreationOptional<string>
  declare yearFrom: number
  declare yearTo: CreationOptional<number | null>
  declare engineCode: CreationOptional<string>
  declare engineCc: CreationOptional<number | null>
  declare fuel: CreationOptional<string>
  declare powerKw: CreationOptional<number | null>
  declare drive: CreationOptional<'FWD' | 'RWD' | 'AWD'>
  declare circuitSplit: CreationOptional<'front-rear' | 'diagonal'>
  /** the steering wheel's side, so the master cylinder's (migration 0020); null: not recorded */
  declare steeringSide: CreationOptional<'left' | 'right' | null>
  declare fluidGrade: CreationOptional<string>
  declare tyreSize: CreationOptional<string>
  declare kerbMassKg: CreationOptional<number | null>
  declare mcBoreMm: CreationOptional<number | null>
  declare mcTandem: CreationOptional<boolean>
  declare mcStrokeMm: CreationOptional<number | null>
  declare pedalRatio: CreationOptional<number | null>
  declare boosterRatio: CreationOptional<number | null>
  declare parkingBrake: CreationOptional<'cable' | 'electric'>
  // grip and balance (migration 0012): the booster's knee, and per load state mass, centre of gravity, front share
  declare boosterRunOutKPa: CreationOptional<number | null>
  declare wheelbaseMm: CreationOptional<number | null>
  declare cogHeightMm: CreationOptional<number | null>
  declare frontStaticSharePercent: CreationOptional<number | null>
  declare ladenMassKg: CreationOptional<number | null>
  declare ladenCogHeightMm: CreationOptional<number | null>
  declare ladenFrontSharePercent: CreationOptional<number | null>
  declare rearValveKneeKPa: CreationOptional<number | null>
  declare rearValveLadenKneeKPa: CreationOptional<number | null>
  declare rearValveSlope: CreationOptional<number | null>
  declare electronicDistribution: CreationOptional<boolean | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class VehicleOption extends Model<InferAttributes<VehicleOption>, InferCreationAttributes<VehicleOption>> {
  declare id: CreationOptional<number>
  declare vehicleId: number
  declare key: string
  declare label: string
  declare question: string
  declare values: { value: string; label: string }[]
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class VehicleBrake extends Model<InferAttributes<VehicleBrake>, InferCreationAttributes<VehicleBrake>> {
  declare id: CreationOptional<number>
  declare vehicleId: number
  declare axle: AxleName
  declare qualifiers: CreationOptional<Qualifiers>
  declare kind: 'disc' | 'drum'
  declare discDiameterMm: CreationOptional<number | null>
  declare discThicknessMm: CreationOptional<number | null>
  declare discMinThicknessMm: CreationOptional<number | null>
  declare discVented: CreationOptional<boolean | null>
  declare drumDiameterMm: CreationOptional<number | null>
  declare drumMaxDiameterMm: CreationOptional<number | null>
  declare caliperType: CreationOptional<'fixed' | 'floating' | null>
  declare pistonDiametersMm: CreationOptional<number[] | null>
  declare wheelCylinderBoreMm: CreationOptional<number | null>
  declare maxRunoutMm: CreationOptional<number | null>
  declare maxThicknessVariationMm: CreationOptional<number | null>
  declare padEdgeMarginMm: CreationOptional<number | null>
  declare drumShoeLayout: CreationOptional<'leading-trailing' | 'two-leading' | 'duo-servo' | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class Part extends Model<InferAttributes<Part>, InferCreationAttributes<Part>> {
  declare id: CreationOptional<number>
  declare sku: string
  declare type: string
  declare productLine: CreationOptional<string>
  declare description: string
  declare specs: CreationOptional<Record<string, unknown>>
  declare status: CreationOptional<'active' | 'discontinued'>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class PartOeNumber extends Model<InferAttributes<PartOeNumber>, InferCreationAttributes<PartOeNumber>> {
  declare id: CreationOptional<number>
  declare partId: number
  declare oeNumber: string
  declare oeNormalised: string
  declare maker: CreationOptional<string>
}

export class Supersession extends Model<InferAttributes<Supersession>, InferCreationAttributes<Supersession>> {
  declare id: CreationOptional<number>
  declare oldSku: string
  declare newPartId: number
  declare note: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
}

export class Fitment extends Model<InferAttributes<Fitment>, InferCreationAttributes<Fitment>> {
  declare id: CreationOptional<number>
  declare vehicleId: number
  declare partId: number
  declare axle: string
  declare side: CreationOptional<'left' | 'right' | 'pair'>
  declare quantity: CreationOptional<number>
  declare qualifiers: CreationOptional<Qualifiers>
  declare note: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class StockLevel extends Model<InferAttributes<StockLevel>, InferCreationAttributes<StockLevel>> {
  declare partId: number
  declare branchId: number
  declare quantity: number
  declare updatedAt: CreationOptional<Date>
}

export class PriceVersion extends Model<InferAttributes<PriceVersion>, InferCreationAttributes<PriceVersion>> {
  declare id: CreationOptional<number>
  declare version: number
  declare label: CreationOptional<string>
  declare status: 'active' | 'retired' | 'scheduled'
  declare effectiveAt: CreationOptional<Date | null>
  declare activatedAt: CreationOptional<Date | null>
  declare createdByUserId: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

/** The price of a part in use now (one row per part), with the version that last set it. */
export class PartPrice extends Model<InferAttributes<PartPrice>, InferCreationAttributes<PartPrice>> {
  declare partId: number
  declare listPriceMinor: number
  declare tradeCostMinor: CreationOptional<number | null>
  declare coreDepositMinor: CreationOptional<number>
  declare packQuantity: CreationOptional<number>
  declare priceVersionId: number
}

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }
const stamps = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE }
const { INTEGER, STRING, FLOAT, BOOLEAN, DATE } = DataTypes

export function initCatalogueModels(sequelize: Sequelize): void {
  Vehicle.init({
    id, make: STRING, model: STRING, generation: STRING, body: STRING, yearFrom: INTEGER, yearTo: INTEGER,
    engineCode: STRING, engineCc: INTEGER, fuel: STRING, powerKw: INTEGER, drive: STRING, circuitSplit: STRING, steeringSide: STRING,
    fluidGrade: STRING, tyreSize: STRING, kerbMassKg: INTEGER, mcBoreMm: FLOAT, mcTandem: BOOLEAN, mcStrokeMm: FLOAT,
    pedalRatio: FLOAT, boosterRatio: FLOAT, parkingBrake: STRING,
    boosterRunOutKPa: { type: FLOAT, field: 'booster_run_out_kpa' }, wheelbaseMm: INTEGER, cogHeightMm: INTEGER, frontStaticSharePercent: FLOAT,
    ladenMassKg: INTEGER, ladenCogHeightMm: INTEGER, ladenFrontSharePercent: FLOAT,
    rearValveKneeKPa: { type: FLOAT, field: 'rear_valve_knee_kpa' }, rearValveLadenKneeKPa: { type: FLOAT, field: 'rear_valve_laden_knee_kpa' },
    rearValveSlope: FLOAT, electronicDistribution: BOOLEAN, ...stamps,
  }, { sequelize, tableName: 'vehicles' })
  VehicleOption.init({
    id, vehicleId: INTEGER, key: STRING, label: STRING, question: STRING, values: jsonColumn('values', []), ...stamps,
  }, { sequelize, tableName: 'vehicle_options' })
  VehicleBrake.init({
    id, vehicleId: INTEGER, axle: STRING, qualifiers: jsonColumn('qualifiers', {}), kind: STRING,
    discDiameterMm: FLOAT, discThicknessMm: FLOAT, discMinThicknessMm: FLOAT, discVented: BOOLEAN,
    drumDiameterMm: FLOAT, drumMaxDiameterMm: FLOAT, caliperType: STRING,
    pistonDiametersMm: jsonColumn('pistonDiametersMm', null), wheelCylinderBoreMm: FLOAT,
    maxRunoutMm: FLOAT, maxThicknessVariationMm: FLOAT, padEdgeMarginMm: FLOAT, drumShoeLayout: STRING, ...stamps,
  }, { sequelize, tableName: 'vehicle_brakes' })
  Part.init({
    id, sku: STRING, type: STRING, productLine: STRING, description: STRING, specs: jsonColumn('specs', {}), status: STRING, ...stamps,
  }, { sequelize, tableName: 'parts' })
  PartOeNumber.init({ id, partId: INTEGER, oeNumber: STRING, oeNormalised: STRING, maker: STRING }, { sequelize, tableName: 'part_oe_numbers', timestamps: false })
  Supersession.init({ id, oldSku: STRING, newPartId: INTEGER, note: STRING, createdAt: DATE }, { sequelize, tableName: 'supersessions', updatedAt: false })
  Fitment.init({
    id, vehicleId: INTEGER, partId: INTEGER, axle: STRING, side: STRING, quantity: INTEGER,
    qualifiers: jsonColumn('qualifiers', {}), note: STRING, ...stamps,
  }, { sequelize, tableName: 'fitments' })
  StockLevel.init({
    partId: { type: INTEGER, primaryKey: true }, branchId: { type: INTEGER, primaryKey: true }, quantity: INTEGER, updatedAt: DATE,
  }, { sequelize, tableName: 'stock_levels', createdAt: false })
  PriceVersion.init({
    id, version: INTEGER, label: STRING, status: STRING, effectiveAt: DATE, activatedAt: DATE, createdByUserId: INTEGER, ...stamps,
  }, { sequelize, tableName: 'price_versions' })
  PartPrice.init({
    partId: { type: INTEGER, primaryKey: true },
    listPriceMinor: INTEGER, tradeCostMinor: INTEGER, coreDepositMinor: INTEGER, packQuantity: INTEGER, priceVersionId: INTEGER,
  }, { sequelize, tableName: 'part_prices', timestamps: false })

  Vehicle.hasMany(VehicleOption, { as: 'options', foreignKey: 'vehicleId' })
  Vehicle.hasMany(VehicleBrake, { as: 'brakes', foreignKey: 'vehicleId' })
  Vehicle.hasMany(Fitment, { as: 'fitments', foreignKey: 'vehicleId' })
  Fitment.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' })
  Fitment.belongsTo(Part, { as: 'part', foreignKey: 'partId' })
  Part.hasMany(Fitment, { as: 'fitments', foreignKey: 'partId' })
  Part.hasMany(PartOeNumber, { as: 'oeNumbers', foreignKey: 'partId' })
  Part.hasMany(StockLevel, { as: 'stock', foreignKey: 'partId' })
  Part.hasOne(PartPrice, { as: 'price', foreignKey: 'partId' })
  Supersession.belongsTo(Part, { as: 'newPart', foreignKey: 'newPartId' })
  PartPrice.belongsTo(PriceVersion, { as: 'priceVersion', foreignKey: 'priceVersionId' })
}

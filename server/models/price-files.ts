/**
 * Price-file models: a price file with its check, and column mappings remembered per supplier. JSON columns
 * (`headers`, `mapping`) are text, exposed parsed. What a check found lives in `price_file_findings`, written
 * and read as JSON chunks by server/services/price-files/findings.ts (no model: never one row at a time).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { jsonColumn } from './json-column'
import type { ColumnMapping, MissingAction, PriceFileStatus } from '../../shared/types/price-files'


export class PriceFile extends Model<InferAttributes<PriceFile>, InferCreationAttributes<PriceFile>> {
  declare id: CreationOptional<number>
  declare status: CreationOptional<PriceFileStatus>
  declare stage: CreationOptional<string | null>
  declare progress: CreationOptional<number>
  declare rowsTotal: CreationOptional<number>
  declare countNew: CreationOptional<number>
  declare countChanged: CreationOptional<number>
  declare countUnchanged: CreationOptional<number>
  declare countMissing: CreationOptional<number>
  declare countRejected: CreationOptional<number>
  declare countLarge: CreationOptional<number>
  declare fileName: string
  declare storedName: CreationOptional<string | null>
  declare fileSize: number
  declare fileFormat: 'csv' | 'xlsx'
  declare delimiter: CreationOptional<string | null>
  declare delimiterChosen: CreationOptional<boolean>
  declare decimalMark: CreationOptional<'.' | ','>
  declare encoding: CreationOptional<string | null>
  declare headers: CreationOptional<string[]>
  declare mapping: CreationOptional<ColumnMapping | null>
  declare supplierName: CreationOptional<string>
  declare errorMessage: CreationOptional<string | null>
  declare basePriceVersionId: CreationOptional<number | null>
  declare priceVersionId: CreationOptional<number | null>
  declare previousPriceVersionId: CreationOptional<number | null>
  declare missingAction: CreationOptional<MissingAction>
  declare excludeRejected: CreationOptional<boolean>
  declare effectiveAt: CreationOptional<Date | null>
  declare createdByUserId: number
  declare appliedByUserId: CreationOptional<number | null>
  declare appliedAt: CreationOptional<Date | null>
  declare rolledBackByUserId: CreationOptional<number | null>
  declare rolledBackAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class PriceColumnMapping extends Model<InferAttributes<PriceColumnMapping>, InferCreationAttributes<PriceColumnMapping>> {
  declare id: CreationOptional<number>
  declare supplierKey: string
  declare supplierName: string
  declare mapping: ColumnMapping
  declare delimiter: CreationOptional<string | null>
  declare decimalMark: CreationOptional<'.' | ','>
  declare updatedByUserId: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }
const stamps = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE }
const { INTEGER, STRING, BOOLEAN, DATE, TEXT } = DataTypes

export function initPriceFileModels(sequelize: Sequelize): void {
  PriceFile.init({
    id, status: STRING, stage: STRING, progress: INTEGER, rowsTotal: INTEGER,
    countNew: INTEGER, countChanged: INTEGER, countUnchanged: INTEGER, countMissing: INTEGER,
    countRejected: INTEGER, countLarge: INTEGER,
    fileName: STRING, storedName: STRING, fileSize: INTEGER, fileFormat: STRING,
    delimiter: STRING, delimiterChosen: BOOLEAN, decimalMark: STRING, encoding: STRING,
    headers: jsonColumn('headers', []), mapping: jsonColumn('mapping', null), supplierName: STRING, errorMessage: TEXT,
    basePriceVersionId: INTEGER, priceVersionId: INTEGER, previousPriceVersionId: INTEGER,
    missingAction: STRING, excludeRejected: BOOLEAN, effectiveAt: DATE,
    createdByUserId: INTEGER, appliedByUserId: INTEGER, appliedAt: DATE,
    rolledBackByUserId: INTEGER, rolledBackAt: DATE, ...stamps,
  }, { sequelize, tableName: 'price_files' })
  PriceColumnMapping.init({
    id, supplierKey: STRING, supplierName: STRING, mapping: jsonColumn('mapping', {}), delimiter: STRING,
    decimalMark: STRING, updatedByUserId: INTEGER, ...stamps,
  }, { sequelize, tableName: 'price_column_mappings' })

}

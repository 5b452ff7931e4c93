/**
 * Quote models (migrations 0006, 0014). Always query quotes with the caller's `organisationId`: a garage sees only
 * its own quotes, and the owner's personal data on them is that garage's alone. JSON columns are text,
 * exposed parsed.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { jsonColumn } from './json-column'
import type { QuoteStatus } from '../../shared/utils/quote-states'
import type { QuoteLineKind } from '../../shared/utils/quote-totals'
import type { MarkupRules } from '../../shared/utils/quote-markup'
import type { OwnerDecision, InspectionFinding, Recommendation } from '../../shared/types/quotes'
import { Organisation, User } from './accounts'
import { Part, Vehicle } from './catalogue'


export class GarageSettings extends Model<InferAttributes<GarageSettings>, InferCreationAttributes<GarageSettings>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare labourRateMinor: CreationOptional<number>
  declare markupRules: MarkupRules
  declare taxRateBp: CreationOptional<number>
  declare quoteValidityDays: CreationOptional<number>
  declare quoteTerms: CreationOptional<string>
  declare logoFile: CreationOptional<string | null>
  declare logoMime: CreationOptional<string | null>
  declare logoUpdatedAt: CreationOptional<Date | null>
  declare pricesIncludeTax: CreationOptional<boolean>
  declare partPriceEnding: CreationOptional<number | null>
  declare coreDepositsPassedOn: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class Quote extends Model<InferAttributes<Quote>, InferCreationAttributes<Quote>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare number: number
  declare revision: CreationOptional<number>
  declare supersedesQuoteId: CreationOptional<number | null>
  declare status: CreationOptional<QuoteStatus>
  declare vehicleId: CreationOptional<number | null>
  declare vehicleLabel: CreationOptional<string>
  declare registration: CreationOptional<string>
  declare odometer: CreationOptional<string>
  declare ownerName: string
  declare ownerEmail: string
  declare ownerPhone: CreationOptional<string>
  declare inspectionId: CreationOptional<number | null>
  declare garageVehicleId: CreationOptional<number | null>
  declare findings: CreationOptional<InspectionFinding[]>
  declare messageToOwner: CreationOptional<string>
  declare tokenHash: CreationOptional<string | null>
  declare sentAt: CreationOptional<Date | null>
  declare sentByUserId: CreationOptional<number | null>
  declare expiresAt: CreationOptional<Date | null>
  declare decidedAt: CreationOptional<Date | null>
  declare decisionIp: CreationOptional<string | null>
  declare decisionUserAgent: CreationOptional<string | null>
  declare signedName: CreationOptional<string | null>
  declare createdByUserId: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare lines?: QuoteLine[]
  declare createdBy?: User
  declare vehicle?: Vehicle | null
}

export class QuoteLine extends Model<InferAttributes<QuoteLine>, InferCreationAttributes<QuoteLine>> {
  declare id: CreationOptional<number>
  declare quoteId: number
  declare position: CreationOptional<number>
  declare kind: QuoteLineKind
  declare parentLineId: CreationOptional<number | null>
  declare partId: CreationOptional<number | null>
  declare sku: CreationOptional<string | null>
  declare partType: CreationOptional<string | null>
  declare description: string
  declare quantity: CreationOptional<number>
  declare hoursHundredths: CreationOptional<number | null>
  declare rateMinor: CreationOptional<number | null>
  declare unitNetMinor: CreationOptional<number | null>
  declare markupBp: CreationOptional<number | null>
  declare unitPriceMinor: CreationOptional<number>
  declare amountMinor: CreationOptional<number>
  declare taxBp: number
  declare recommendation: CreationOptional<Recommendation | null>
  declare reason: CreationOptional<string | null>
  declare coreCharge: CreationOptional<'charged' | 'absorbed' | null>
  declare ownerDecision: CreationOptional<OwnerDecision | null>
  declare toldOwnerDeclinedRequired: CreationOptional<boolean>
  declare toldOwnerRecordedByUserId: CreationOptional<number | null>
  declare toldOwnerRecordedAt: CreationOptional<Date | null>
  declare taxIncluded: CreationOptional<boolean>
  declare declineStatement: CreationOptional<string | null>
  declare declineSignedName: CreationOptional<string | null>
  declare declineSignedAt: CreationOptional<Date | null>
  declare declineAddress: CreationOptional<string | null>
  declare declineUserAgent: CreationOptional<string | null>
  declare coreRefundMinor: CreationOptional<number>
  declare coreRefundRecordedAt: CreationOptional<Date | null>
  /** a manager's reason for putting on a part the catalogue does not fit to the vehicle (never shown to the owner) */
  declare fitOverrideReason: CreationOptional<string | null>
  declare labourOperation: CreationOptional<string | null>
  declare guideHundredths: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export function initQuoteModels(sequelize: Sequelize): void {
  const { INTEGER, STRING, TEXT, DATE, BOOLEAN } = DataTypes
  const id = { type: INTEGER, primaryKey: true, autoIncrement: true }
  const stamps = { createdAt: DATE, updatedAt: DATE }
  // defaults repeat the migration's, so a created instance holds what the row holds
  const d = <T>(type: T, defaultValue: unknown) => ({ type, defaultValue })
  GarageSettings.init({
    id, organisationId: INTEGER, labourRateMinor: d(INTEGER, 0), markupRules: jsonColumn('markupRules', null), taxRateBp: d(INTEGER, 2000),
    quoteValidityDays: d(INTEGER, 30), quoteTerms: d(TEXT, ''), logoFile: STRING, logoMime: STRING, logoUpdatedAt: DATE,
    pricesIncludeTax: d(BOOLEAN, false), partPriceEnding: INTEGER, coreDepositsPassedOn: d(BOOLEAN, false), ...stamps,
  }, { sequelize, tableName: 'garage_settings' })
  Quote.init({
    id, organisationId: INTEGER, number: INTEGER, revision: d(INTEGER, 1), supersedesQuoteId: INTEGER, status: d(STRING, 'draft'),
    vehicleId: INTEGER, vehicleLabel: d(STRING, ''), registration: d(STRING, ''), odometer: d(STRING, ''),
    ownerName: STRING, ownerEmail: STRING, ownerPhone: d(STRING, ''), inspectionId: INTEGER, garageVehicleId: INTEGER,
    findings: jsonColumn('findings', []), messageToOwner: d(TEXT, ''), tokenHash: STRING, sentAt: DATE, sentByUserId: INTEGER, expiresAt: DATE, decidedAt: DATE,
    decisionIp: STRING, decisionUserAgent: STRING, signedName: STRING, createdByUserId: INTEGER, ...stamps,
  }, { sequelize, tableName: 'quotes' })
  QuoteLine.init({
    id, quoteId: INTEGER, position: d(INTEGER, 0), kind: STRING, parentLineId: INTEGER, partId: INTEGER, sku: STRING,
    partType: STRING, description: STRING, quantity: d(INTEGER, 1), hoursHundredths: INTEGER, rateMinor: INTEGER,
    unitNetMinor: INTEGER, markupBp: INTEGER, unitPriceMinor: d(INTEGER, 0), amountMinor: d(INTEGER, 0), taxBp: INTEGER,
    recommendation: STRING, reason: TEXT, coreCharge: STRING, ownerDecision: STRING,
    toldOwnerDeclinedRequired: d(BOOLEAN, false), toldOwnerRecordedByUserId: INTEGER, toldOwnerRecordedAt: DATE,
    taxIncluded: d(BOOLEAN, false), declineStatement: TEXT, declineSignedName: STRING, declineSignedAt: DATE, declineAddress: STRING,
    declineUserAgent: STRING, coreRefundMinor: d(INTEGER, 0), coreRefundRecordedAt: DATE,
    fitOverrideReason: STRING, labourOperation: STRING, guideHundredths: INTEGER, ...stamps,
  }, { sequelize, tableName: 'quote_lines' })

  GarageSettings.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
  Quote.hasMany(QuoteLine, { as: 'lines', foreignKey: 'quoteId' })
  QuoteLine.belongsTo(Quote, { as: 'quote', foreignKey: 'quoteId' })
  QuoteLine.belongsTo(Part, { as: 'part', foreignKey: 'partId' })
  Quote.belongsTo(User, { as: 'createdBy', foreignKey: 'createdByUserId' })
  Quote.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' })
  Quote.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
}

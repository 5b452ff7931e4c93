/** Proof-of-trade documents and the single-use links of a person's account (tables of migration 0003-accounts). */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { Organisation, User } from './accounts'

export type AccountTokenKind = 'reset' | 'invite'

export class ProofDocument extends Model<InferAttributes<ProofDocument>, InferCreationAttributes<ProofDocument>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare storedName: string
  declare originalName: string
  declare mime: string
  declare sizeBytes: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class AccountToken extends Model<InferAttributes<AccountToken>, InferCreationAttributes<AccountToken>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare kind: AccountTokenKind
  /** hex SHA-256 of the token sent by e-mail; the token itself is never stored */
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: CreationOptional<Date | null>
  declare createdByUserId: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
}

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }

export function initAccountExtraModels(sequelize: Sequelize): void {
  ProofDocument.init({
    id, organisationId: DataTypes.INTEGER, storedName: DataTypes.STRING, originalName: DataTypes.STRING,
    mime: DataTypes.STRING, sizeBytes: DataTypes.INTEGER, createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE,
  }, { sequelize, tableName: 'proof_documents' })
  AccountToken.init({
    id, userId: DataTypes.INTEGER, kind: DataTypes.STRING, tokenHash: DataTypes.STRING, expiresAt: DataTypes.DATE,
    usedAt: DataTypes.DATE, createdByUserId: DataTypes.INTEGER, createdAt: DataTypes.DATE,
  }, { sequelize, tableName: 'account_tokens', updatedAt: false })

  ProofDocument.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
  Organisation.hasMany(ProofDocument, { as: 'proofDocuments', foreignKey: 'organisationId' })
  AccountToken.belongsTo(User, { as: 'user', foreignKey: 'userId' })
}

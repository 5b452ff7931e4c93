/** Two-step sign-in: a person's TOTP secret, their recovery codes and half-signed sign-ins (tables of migration 0011-second-factor). */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { User } from './accounts'

export type ChallengePurpose = 'verify' | 'enrol'

export class SecondFactor extends Model<InferAttributes<SecondFactor>, InferCreationAttributes<SecondFactor>> {
  declare userId: number
  /** the confirmed secret, sealed (server/services/mfa-secrets.ts); null while none is confirmed */
  declare secret: CreationOptional<string | null>
  declare enrolledAt: CreationOptional<Date | null>
  declare lastTimeStep: CreationOptional<number | null>
  /** the secret of an enrolment under way, sealed */
  declare pendingSecret: CreationOptional<string | null>
  declare pendingExpiresAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class RecoveryCode extends Model<InferAttributes<RecoveryCode>, InferCreationAttributes<RecoveryCode>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare salt: string
  /** hex SHA-256 of salt + code; the code itself is shown once and never stored */
  declare codeHash: string
  declare usedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
}

export class SignInChallenge extends Model<InferAttributes<SignInChallenge>, InferCreationAttributes<SignInChallenge>> {
  /** hex SHA-256 of the value in the browser's cookie */
  declare id: string
  declare userId: number
  declare purpose: ChallengePurpose
  /** the person's session version when the password was checked: a password change meanwhile voids it */
  declare sessionVersion: number
  declare attempts: CreationOptional<number>
  declare expiresAt: Date
  declare usedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
}

export function initSecondFactorModels(sequelize: Sequelize): void {
  SecondFactor.init({
    userId: { type: DataTypes.INTEGER, primaryKey: true }, secret: DataTypes.TEXT, enrolledAt: DataTypes.DATE,
    lastTimeStep: DataTypes.INTEGER, pendingSecret: DataTypes.TEXT, pendingExpiresAt: DataTypes.DATE,
    createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE,
  }, { sequelize, tableName: 'second_factors' })
  RecoveryCode.init({
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }, userId: DataTypes.INTEGER,
    salt: DataTypes.STRING, codeHash: DataTypes.STRING, usedAt: DataTypes.DATE, createdAt: DataTypes.DATE,
  }, { sequelize, tableName: 'recovery_codes', updatedAt: false })
  SignInChallenge.init({
    id: { type: DataTypes.STRING, primaryKey: true }, userId: DataTypes.INTEGER, purpose: DataTypes.STRING,
    sessionVersion: DataTypes.INTEGER, attempts: { type: DataTypes.INTEGER, defaultValue: 0 }, expiresAt: DataTypes.DATE,
    usedAt: DataTypes.DATE, createdAt: DataTypes.DATE,
  }, { sequelize, tableName: 'sign_in_challenges', updatedAt: false })
  SecondFactor.belongsTo(User, { as: 'user', foreignKey: 'userId' })
  RecoveryCode.belongsTo(User, { as: 'user', foreignKey: 'userId' })
  SignInChallenge.belongsTo(User, { as: 'user', foreignKey: 'userId' })
}

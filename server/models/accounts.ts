import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize, type Transaction } from 'sequelize'
import { authDataChanged } from '../utils/session-cache'
import type { OrgKind, OrgStatus, PaymentTerms, Role, UserStatus } from '../../shared/types/accounts'

export class Branch extends Model<InferAttributes<Branch>, InferCreationAttributes<Branch>> {
  declare id: CreationOptional<number>
  declare code: string
  declare name: string
  declare address: CreationOptional<string>
  /** delivery and collection (columns of migration 0015-counter-day): the counter's weekday hours in minutes after
   *  local midnight, how long a part takes to reach the counter, how long stock sent from here takes to reach
   *  another branch */
  declare collection: CreationOptional<boolean>
  declare counterOpensMinute: CreationOptional<number>
  declare counterClosesMinute: CreationOptional<number>
  declare collectionMinutes: CreationOptional<number>
  declare transferMinutes: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class DiscountTier extends Model<InferAttributes<DiscountTier>, InferCreationAttributes<DiscountTier>> {
  declare id: CreationOptional<number>
  declare name: string
  declare percentBp: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class Organisation extends Model<InferAttributes<Organisation>, InferCreationAttributes<Organisation>> {
  declare id: CreationOptional<number>
  declare kind: OrgKind
  declare name: string
  declare status: CreationOptional<OrgStatus>
  declare tradingAddress: CreationOptional<string>
  declare taxNumber: CreationOptional<string>
  declare contactName: CreationOptional<string>
  declare phone: CreationOptional<string>
  declare email: CreationOptional<string>
  declare tierId: CreationOptional<number | null>
  declare paymentTerms: CreationOptional<PaymentTerms>
  declare creditLimitMinor: CreationOptional<number>
  declare paymentDays: CreationOptional<number>
  declare homeBranchId: CreationOptional<number | null>
  declare decisionReason: CreationOptional<string | null>
  declare decidedAt: CreationOptional<Date | null>
  /** garage setting: technicians see trade prices in the catalogue (column of migration 0004-catalogue-extra) */
  declare techniciansSeePrices: CreationOptional<boolean>
  /** an admin's lift of the account stop: last local day it holds, and why (columns of migration 0017-money-owed) */
  declare stopLiftedUntil: CreationOptional<string | null>
  declare stopLiftReason: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare email: string
  declare name: string
  declare role: Role
  declare phone: CreationOptional<string>
  declare passwordHash: CreationOptional<string | null>
  declare status: CreationOptional<UserStatus>
  declare sessionVersion: CreationOptional<number>
  declare lastSignInAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class SessionRecord extends Model<InferAttributes<SessionRecord>, InferCreationAttributes<SessionRecord>> {
  declare id: string
  declare userId: number
  declare sessionVersion: number
  declare ip: CreationOptional<string>
  declare userAgent: CreationOptional<string>
  declare lastSeenAt: Date
  declare expiresAt: Date
  declare revokedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>
  declare actorUserId: number | null
  declare organisationId: number | null
  declare action: string
  declare entity: string
  declare entityId: string | null
  declare changes: string
  declare createdAt: CreationOptional<Date>
}

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }
const stamps = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE }

export function initAccountModels(sequelize: Sequelize): void {
  Branch.init({
    id, code: DataTypes.STRING, name: DataTypes.STRING, address: DataTypes.TEXT,
    // columns of migration 0015-counter-day
    collection: { type: DataTypes.BOOLEAN, defaultValue: true },
    counterOpensMinute: { type: DataTypes.INTEGER, defaultValue: 450 },
    counterClosesMinute: { type: DataTypes.INTEGER, defaultValue: 1050 },
    collectionMinutes: { type: DataTypes.INTEGER, defaultValue: 15 },
    transferMinutes: { type: DataTypes.INTEGER, defaultValue: 180 },
    ...stamps,
  }, { sequelize, tableName: 'branches' })
  DiscountTier.init({ id, name: DataTypes.STRING, percentBp: DataTypes.INTEGER, ...stamps }, { sequelize, tableName: 'discount_tiers' })
  Organisation.init({
    id, kind: DataTypes.STRING, name: DataTypes.STRING, status: DataTypes.STRING,
    tradingAddress: DataTypes.TEXT, taxNumber: DataTypes.STRING, contactName: DataTypes.STRING,
    phone: DataTypes.STRING, email: DataTypes.STRING, tierId: DataTypes.INTEGER,
    paymentTerms: DataTypes.STRING, creditLimitMinor: DataTypes.INTEGER, paymentDays: DataTypes.INTEGER,
    homeBranchId: DataTypes.INTEGER, decisionReason: DataTypes.TEXT, decidedAt: DataTypes.DATE,
    techniciansSeePrices: { type: DataTypes.BOOLEAN, defaultValue: false }, // column of migration 0004-catalogue-extra
    stopLiftedUntil: DataTypes.STRING, stopLiftReason: DataTypes.STRING, // columns of migration 0017-money-owed
    ...stamps,
  }, { sequelize, tableName: 'organisations' })
  User.init({
    id, organisationId: DataTypes.INTEGER, email: DataTypes.STRING, name: DataTypes.STRING, role: DataTypes.STRING,
    phone: { type: DataTypes.STRING, defaultValue: '' }, // column of migration 0003-accounts
    passwordHash: DataTypes.TEXT, status: DataTypes.STRING, sessionVersion: DataTypes.INTEGER,
    lastSignInAt: DataTypes.DATE, ...stamps,
  }, { sequelize, tableName: 'users' })
  SessionRecord.init({
    id: { type: DataTypes.STRING, primaryKey: true }, userId: DataTypes.INTEGER, sessionVersion: DataTypes.INTEGER,
    ip: DataTypes.STRING, userAgent: DataTypes.STRING, lastSeenAt: DataTypes.DATE, expiresAt: DataTypes.DATE,
    revokedAt: DataTypes.DATE, ...stamps,
  }, { sequelize, tableName: 'sessions' })
  AuditEntry.init({
    id, actorUserId: DataTypes.INTEGER, organisationId: DataTypes.INTEGER, action: DataTypes.STRING,
    entity: DataTypes.STRING, entityId: DataTypes.STRING, changes: DataTypes.TEXT, createdAt: DataTypes.DATE,
  }, { sequelize, tableName: 'audit_log', updatedAt: false })

  Organisation.belongsTo(DiscountTier, { as: 'tier', foreignKey: 'tierId' })
  Organisation.belongsTo(Branch, { as: 'homeBranch', foreignKey: 'homeBranchId' })
  Organisation.hasMany(User, { as: 'users', foreignKey: 'organisationId' })
  User.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
  SessionRecord.belongsTo(User, { as: 'user', foreignKey: 'userId' })

  // the session check caches these rows (server/utils/session-cache.ts): any change drops the cache at once and
  // again at commit, so a reader that started in between cannot keep the old rows
  const dropSessionMemory = (...args: unknown[]) => {
    authDataChanged()
    const options = args.find((a): a is { transaction?: Transaction | null } => typeof a === 'object' && a !== null && 'transaction' in a)
    options?.transaction?.afterCommit(() => authDataChanged())
  }
  for (const model of [Organisation, User, SessionRecord]) {
    const addHook = model.addHook as unknown as (hook: string, name: string, fn: (...args: unknown[]) => void) => void
    for (const hook of ['afterSave', 'afterDestroy', 'afterUpsert', 'afterBulkCreate', 'afterBulkUpdate', 'afterBulkDestroy']) {
      addHook.call(model, hook, 'session-cache', dropSessionMemory)
    }
  }
}

/**
 * Money owed (0018-owed-reminders): the admin's allocation of an account payment to named charges, and the
 * reminders e-mailed to garages about what they owe (one row per garage and subject, claimed before sending).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { AccountReminderKind, AccountReminderStatus } from '../../shared/types/money-owed'
import { Organisation } from './accounts'

export class PaymentAllocation extends Model<InferAttributes<PaymentAllocation>, InferCreationAttributes<PaymentAllocation>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare paymentEntryId: number
  declare chargeEntryId: number
  declare amountMinor: number
  declare createdAt: CreationOptional<Date>
}

export type { AccountReminderKind }

export class AccountReminder extends Model<InferAttributes<AccountReminder>, InferCreationAttributes<AccountReminder>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare kind: AccountReminderKind
  /** what it is about: `2026-11` for a month's statement, `<entry id>:<days>` for an overdue reminder */
  declare about: string
  declare status: AccountReminderStatus
  declare recipients: CreationOptional<string>
  declare subject: CreationOptional<string>
  declare amountMinor: CreationOptional<number>
  declare claimedAt: Date
  declare sentAt: CreationOptional<Date | null>
  declare error: CreationOptional<string | null>
}

export function initMoneyOwedModels(sequelize: Sequelize): void {
  const { INTEGER, STRING, TEXT, DATE } = DataTypes
  const id = { type: INTEGER, primaryKey: true, autoIncrement: true }
  PaymentAllocation.init({
    id, organisationId: INTEGER, paymentEntryId: INTEGER, chargeEntryId: INTEGER, amountMinor: INTEGER, createdAt: DATE,
  }, { sequelize, tableName: 'payment_allocations', updatedAt: false })
  AccountReminder.init({
    id, organisationId: INTEGER, kind: STRING, about: STRING, status: STRING, recipients: { type: TEXT, defaultValue: '' },
    subject: { type: STRING, defaultValue: '' }, amountMinor: { type: INTEGER, defaultValue: 0 }, claimedAt: DATE, sentAt: DATE, error: STRING,
  }, { sequelize, tableName: 'account_reminders', timestamps: false })
  AccountReminder.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
}

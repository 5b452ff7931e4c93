import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * Money owed, continued:
 * - payment allocations: the part of an account payment the admin set against a named charge (the rest of the
 *   payment settles the oldest charges);
 * - account reminders: each monthly statement and each overdue reminder e-mailed to a garage, one row per
 *   (garage, what it is about) under a unique key, so two processes running the job never send one twice;
 * - indexes for the dashboards' ranges of days.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const { INTEGER, STRING, TEXT, DATE } = DataTypes
  const id = { type: INTEGER, primaryKey: true, autoIncrement: true }
  const ref = (table: string) => ({ type: INTEGER, allowNull: false, references: { model: table, key: 'id' }, onDelete: 'CASCADE' })

  await qi.createTable('payment_allocations', {
    id, organisation_id: ref('organisations'), payment_entry_id: ref('ledger_entries'), charge_entry_id: ref('ledger_entries'),
    amount_minor: { type: INTEGER, allowNull: false },
    created_at: { type: DATE, allowNull: false },
  })
  await qi.addIndex('payment_allocations', ['payment_entry_id', 'charge_entry_id'], { unique: true })
  await qi.addIndex('payment_allocations', ['organisation_id'])

  await qi.createTable('account_reminders', {
    id, organisation_id: ref('organisations'),
    kind: { type: STRING(16), allowNull: false },
    about: { type: STRING(80), allowNull: false },
    status: { type: STRING(16), allowNull: false },
    recipients: { type: TEXT, allowNull: false, defaultValue: '' },
    subject: { type: STRING(200), allowNull: false, defaultValue: '' },
    amount_minor: { type: INTEGER, allowNull: false, defaultValue: 0 },
    claimed_at: { type: DATE, allowNull: false },
    sent_at: { type: DATE, allowNull: true },
    error: { type: STRING(300), allowNull: true },
  })
  await qi.addIndex('account_reminders', ['organisation_id', 'kind', 'about'], { unique: true })
  await qi.addIndex('account_reminders', ['claimed_at'])

  // the dashboards read a range of days across every garage, and one garage's quotes by the day they were sent
  await qi.addIndex('orders', ['created_at'])
  await qi.addIndex('quotes', ['organisation_id', 'sent_at'])
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeIndex('quotes', ['organisation_id', 'sent_at'])
  await qi.removeIndex('orders', ['created_at'])
  await qi.dropTable('account_reminders')
  await qi.dropTable('payment_allocations')
}

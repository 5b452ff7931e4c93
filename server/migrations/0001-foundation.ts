import { DataTypes, type QueryInterface } from 'sequelize'

const ts = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
}

/** Organisations (the distributor and its garages), branches, tiers, people, sessions, audit log. */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('branches', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    code: { type: DataTypes.STRING(16), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    address: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    ...ts,
  })
  await qi.createTable('discount_tiers', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING(60), allowNull: false, unique: true },
    // basis points so that 12.5 % is exact: 1250
    percent_bp: { type: DataTypes.INTEGER, allowNull: false },
    ...ts,
  })
  await qi.createTable('organisations', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    kind: { type: DataTypes.STRING(16), allowNull: false }, // distributor | garage
    name: { type: DataTypes.STRING(160), allowNull: false },
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pending' },
    trading_address: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    tax_number: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    contact_name: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
    phone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    email: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
    tier_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'discount_tiers', key: 'id' } },
    payment_terms: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'card' }, // card | account
    credit_limit_minor: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    payment_days: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    home_branch_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'branches', key: 'id' } },
    decision_reason: { type: DataTypes.TEXT, allowNull: true },
    decided_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  })
  await qi.addIndex('organisations', ['kind', 'status'])
  await qi.createTable('users', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'organisations', key: 'id' } },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(32), allowNull: false },
    password_hash: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' }, // active | invited | removed
    // bumped to end every session of the user at once (password change, removal)
    session_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    last_sign_in_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  })
  await qi.addIndex('users', ['organisation_id'])
  await qi.createTable('sessions', {
    id: { type: DataTypes.STRING(64), primaryKey: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    session_version: { type: DataTypes.INTEGER, allowNull: false },
    ip: { type: DataTypes.STRING(64), allowNull: false, defaultValue: '' },
    user_agent: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
    last_seen_at: { type: DataTypes.DATE, allowNull: false },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  })
  await qi.addIndex('sessions', ['user_id'])
  await qi.createTable('audit_log', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    actor_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    organisation_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'organisations', key: 'id' } },
    action: { type: DataTypes.STRING(80), allowNull: false },
    entity: { type: DataTypes.STRING(60), allowNull: false },
    entity_id: { type: DataTypes.STRING(64), allowNull: true },
    changes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('audit_log', ['entity', 'entity_id'])
  await qi.addIndex('audit_log', ['organisation_id', 'created_at'])
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const t of ['audit_log', 'sessions', 'users', 'organisations', 'discount_tiers', 'branches']) await qi.dropTable(t)
}

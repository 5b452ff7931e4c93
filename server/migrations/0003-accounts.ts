import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * Trade accounts: the proof-of-trade documents garages upload with their application, single-use links
 * (password reset, staff invitation; only a SHA-256 of the token is kept) and a phone number on people.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('proof_documents', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'organisations', key: 'id' }, onDelete: 'CASCADE' },
    // server-generated random file name under <uploads>/proofs/; never derived from what the client sent
    stored_name: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    original_name: { type: DataTypes.STRING(255), allowNull: false },
    // detected from the file's bytes, not the client's claim
    mime: { type: DataTypes.STRING(40), allowNull: false },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('proof_documents', ['organisation_id'])
  await qi.createTable('account_tokens', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(16), allowNull: false }, // reset | invite
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true }, // hex SHA-256 of the token
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_by_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('account_tokens', ['user_id', 'kind'])
  await qi.addColumn('users', 'phone', { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' })
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('users', 'phone')
  await qi.dropTable('account_tokens')
  await qi.dropTable('proof_documents')
}

import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * Two-step sign-in: a person's TOTP secret (sealed with the server's key, never stored in the clear) and the last
 * time step used, so a code cannot be used twice; ten single-use recovery codes, each kept only as a salted hash;
 * and the short-lived half-signed state between the password and the code (only the SHA-256 of its cookie kept).
 * Sessions of distributor staff end here, so they sign in again with the second step.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('second_factors', {
    user_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    // sealed (AES-256-GCM) base32 secret; null until enrolment is confirmed with a first code
    secret: { type: DataTypes.TEXT, allowNull: true },
    enrolled_at: { type: DataTypes.DATE, allowNull: true },
    // the time step of the last code accepted: codes of that step and earlier are refused (no replay)
    last_time_step: { type: DataTypes.INTEGER, allowNull: true },
    // an enrolment under way: the secret shown to the person, until they confirm it with a code
    pending_secret: { type: DataTypes.TEXT, allowNull: true },
    pending_expires_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.createTable('recovery_codes', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    salt: { type: DataTypes.STRING(32), allowNull: false },
    code_hash: { type: DataTypes.STRING(64), allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('recovery_codes', ['user_id'])
  await qi.createTable('sign_in_challenges', {
    // hex SHA-256 of the random value in the browser's cookie
    id: { type: DataTypes.STRING(64), primaryKey: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    purpose: { type: DataTypes.STRING(16), allowNull: false }, // verify | enrol
    session_version: { type: DataTypes.INTEGER, allowNull: false },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('sign_in_challenges', ['user_id'])
  // distributor staff signed in before two steps existed: they sign in again, and enrol
  await qi.sequelize.query(`UPDATE sessions SET revoked_at = CURRENT_TIMESTAMP WHERE revoked_at IS NULL
    AND user_id IN (SELECT id FROM users WHERE role IN ('distributor_admin', 'counter_staff'))`)
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('sign_in_challenges')
  await qi.dropTable('recovery_codes')
  await qi.dropTable('second_factors')
}

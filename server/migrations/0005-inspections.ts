import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * Inspections: a garage's record of measured wear and fluid readings on one vehicle, with the verdicts and the
 * catalogue parts they recommend, kept so a quote can be drafted from them later. Immutable once recorded
 * (a new reading is a new inspection), so there is no updated_at.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('inspections', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'organisations', key: 'id' }, onDelete: 'CASCADE' },
    vehicle_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'vehicles', key: 'id' } },
    author_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    registration: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' }, // as written on the job card
    odometer: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' }, // free text: "84 210 mi", "131 000 km"
    answers: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' }, // JSON { vehicle option key: value }
    wear_input: { type: DataTypes.TEXT, allowNull: false }, // JSON, the validated POST /api/calculations/wear body
    result: { type: DataTypes.TEXT, allowNull: false }, // JSON, computeWear's answer
    overall: { type: DataTypes.STRING(8), allowNull: false }, // ok | advise | fail (for lists)
    recommended_parts: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' }, // JSON, catalogue parts per axle/type
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('inspections', ['organisation_id', 'created_at'])
  await qi.addIndex('inspections', ['organisation_id', 'vehicle_id'])
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('inspections')
}

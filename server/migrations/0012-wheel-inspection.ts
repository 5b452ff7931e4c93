import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * Brake engineering and the inspection a workshop does:
 * - vehicles carry what grip and balance need: the booster's run-out pressure, the wheelbase, and per load state
 *   (unladen, laden) the mass, centre of gravity height and static front axle share; the rear pressure valve's
 *   knee and slope (a load-sensing valve has a laden knee) and whether electronic brake-force distribution is fitted;
 * - an original-equipment brake carries the pad's edge margin on its disc and a drum's shoe layout;
 * - photos a technician takes of a wheel's finding, kept under server-made names (uploads/inspection-photos).
 */
export async function up(qi: QueryInterface): Promise<void> {
  const { FLOAT, INTEGER, BOOLEAN, STRING, DATE } = DataTypes
  const vehicleColumns = [
    ['booster_run_out_kpa', FLOAT], ['wheelbase_mm', INTEGER], ['cog_height_mm', INTEGER], ['front_static_share_percent', FLOAT],
    ['laden_mass_kg', INTEGER], ['laden_cog_height_mm', INTEGER], ['laden_front_share_percent', FLOAT],
    ['rear_valve_knee_kpa', FLOAT], ['rear_valve_laden_knee_kpa', FLOAT], ['rear_valve_slope', FLOAT], ['electronic_distribution', BOOLEAN],
  ] as const
  for (const [name, type] of vehicleColumns) await qi.addColumn('vehicles', name, { type, allowNull: true })
  await qi.addColumn('vehicle_brakes', 'pad_edge_margin_mm', { type: FLOAT, allowNull: true })
  await qi.addColumn('vehicle_brakes', 'drum_shoe_layout', { type: STRING(20), allowNull: true }) // leading-trailing | two-leading | duo-servo

  await qi.createTable('inspection_photos', {
    id: { type: INTEGER, primaryKey: true, autoIncrement: true },
    inspection_id: { type: INTEGER, allowNull: false, references: { model: 'inspections', key: 'id' }, onDelete: 'CASCADE' },
    organisation_id: { type: INTEGER, allowNull: false, references: { model: 'organisations', key: 'id' }, onDelete: 'CASCADE' },
    author_user_id: { type: INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    position: { type: STRING(12), allowNull: false }, // front-left | front-right | rear-left | rear-right | system
    subject: { type: STRING(20), allowNull: false }, // disc | pads | drum | shoes | hose | pipe | caliper | wheel-cylinder | leak | parking-brake | fluid
    caption: { type: STRING(140), allowNull: false, defaultValue: '' },
    stored_name: { type: STRING(40), allowNull: false }, // 32 hex + extension, under uploads/inspection-photos
    mime: { type: STRING(20), allowNull: false },
    bytes: { type: INTEGER, allowNull: false },
    created_at: { type: DATE, allowNull: false },
  })
  await qi.addIndex('inspection_photos', ['inspection_id'])
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('inspection_photos')
  await qi.removeColumn('vehicle_brakes', 'drum_shoe_layout')
  await qi.removeColumn('vehicle_brakes', 'pad_edge_margin_mm')
  for (const name of ['booster_run_out_kpa', 'wheelbase_mm', 'cog_height_mm', 'front_static_share_percent', 'laden_mass_kg', 'laden_cog_height_mm',
    'laden_front_share_percent', 'rear_valve_knee_kpa', 'rear_valve_laden_knee_kpa', 'rear_valve_slope', 'electronic_distribution']) {
    await qi.removeColumn('vehicles', name)
  }
}

import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * From an approved quote to a finished job:
 * - part relations: what else a part needs (fitting kit, wear sensor, hardware, wheel cylinders with shoes, pads
 *   with discs, fluid by the vehicle's volume), with quantity and reason;
 * - vehicle job data: the workshop figures a job card prints (torques, fluid capacity), kept apart from the
 *   catalogue's vehicle columns;
 * - labour times: the guide's hours per vehicle and operation, and a garage's own hours (organisation set);
 * - quote lines remember a fitment override's reason, and a labour line its operation and the guide's hours;
 * - job cards (the technician's checks and sign-off) and the garage's invoices to owners, numbered per garage
 *   from their own series, with payments taken at the desk.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const { INTEGER, STRING, TEXT, DATE, BOOLEAN } = DataTypes
  const id = { type: INTEGER, primaryKey: true, autoIncrement: true }
  const stamps = { created_at: { type: DATE, allowNull: false }, updated_at: { type: DATE, allowNull: false } }
  const ref = (table: string, nullable = false, onDelete = 'CASCADE') => ({ type: INTEGER, allowNull: nullable, references: { model: table, key: 'id' }, onDelete })

  await qi.createTable('part_relations', {
    id, part_id: ref('parts'), related_part_id: ref('parts'),
    relation: { type: STRING(24), allowNull: false },
    quantity: { type: INTEGER, allowNull: false, defaultValue: 1 },
    by_fluid_volume: { type: BOOLEAN, allowNull: false, defaultValue: false },
    reason: { type: STRING(300), allowNull: false, defaultValue: '' },
    ...stamps,
  })
  await qi.addIndex('part_relations', ['part_id', 'related_part_id'], { unique: true })

  await qi.createTable('vehicle_job_data', {
    vehicle_id: { type: INTEGER, primaryKey: true, references: { model: 'vehicles', key: 'id' }, onDelete: 'CASCADE' },
    fluid_capacity_ml: { type: INTEGER, allowNull: true },
    torques: { type: TEXT, allowNull: false, defaultValue: '[]' },
    ...stamps,
  })

  await qi.createTable('labour_times', {
    id, vehicle_id: ref('vehicles'), organisation_id: ref('organisations', true),
    operation: { type: STRING(32), allowNull: false },
    hours_hundredths: { type: INTEGER, allowNull: false },
    updated_by_user_id: ref('users', true, 'SET NULL'),
    ...stamps,
  })
  await qi.addIndex('labour_times', ['vehicle_id', 'operation', 'organisation_id'])

  await qi.addColumn('quote_lines', 'fit_override_reason', { type: STRING(300), allowNull: true })
  await qi.addColumn('quote_lines', 'labour_operation', { type: STRING(32), allowNull: true })
  await qi.addColumn('quote_lines', 'guide_hundredths', { type: INTEGER, allowNull: true })

  await qi.createTable('job_cards', {
    id, quote_id: ref('quotes'), organisation_id: ref('organisations'),
    checks: { type: TEXT, allowNull: false, defaultValue: '[]' },
    odometer: { type: INTEGER, allowNull: true },
    signed_off_by_user_id: ref('users', true, 'SET NULL'),
    signed_off_at: { type: DATE, allowNull: true },
    ...stamps,
  })
  await qi.addIndex('job_cards', ['quote_id'], { unique: true })

  await qi.createTable('owner_invoice_series', {
    organisation_id: { type: INTEGER, primaryKey: true, references: { model: 'organisations', key: 'id' }, onDelete: 'CASCADE' },
    last_number: { type: INTEGER, allowNull: false, defaultValue: 0 },
    ...stamps,
  })
  await qi.createTable('owner_invoices', {
    id, organisation_id: ref('organisations'), quote_id: ref('quotes'),
    number: { type: INTEGER, allowNull: false },
    owner_name: { type: STRING(120), allowNull: false },
    owner_email: { type: STRING(254), allowNull: false },
    lines: { type: TEXT, allowNull: false, defaultValue: '[]' },
    tax_by_rate: { type: TEXT, allowNull: false, defaultValue: '[]' },
    net_minor: { type: INTEGER, allowNull: false },
    tax_minor: { type: INTEGER, allowNull: false },
    gross_minor: { type: INTEGER, allowNull: false },
    currency: { type: STRING(3), allowNull: false },
    issued_by_user_id: ref('users', true, 'SET NULL'),
    issued_at: { type: DATE, allowNull: false },
    mailed_at: { type: DATE, allowNull: true },
    ...stamps,
  })
  await qi.addIndex('owner_invoices', ['organisation_id', 'number'], { unique: true })
  await qi.addIndex('owner_invoices', ['quote_id'], { unique: true })
  await qi.createTable('owner_invoice_payments', {
    id, owner_invoice_id: ref('owner_invoices'),
    method: { type: STRING(16), allowNull: false },
    amount_minor: { type: INTEGER, allowNull: false },
    reference: { type: STRING(80), allowNull: false, defaultValue: '' },
    recorded_by_user_id: ref('users', true, 'SET NULL'),
    ...stamps,
  })
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const t of ['owner_invoice_payments', 'owner_invoices', 'owner_invoice_series', 'job_cards', 'labour_times', 'vehicle_job_data', 'part_relations']) await qi.dropTable(t)
  for (const c of ['guide_hundredths', 'labour_operation', 'fit_override_reason']) await qi.removeColumn('quote_lines', c)
}

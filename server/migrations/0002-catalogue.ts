import { DataTypes, type QueryInterface } from 'sequelize'
import { ddlRunner } from '../utils/sql'

const ts = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
}
const ref = (model: string, onDelete = 'CASCADE') => ({ references: { model, key: 'id' }, onDelete })

/**
 * Catalogue: vehicles with their original-equipment brakes per axle and their option questions, parts with
 * type-specific specifications (JSON validated by shared/schemas/parts.ts), OE numbers, supersessions,
 * fitment with qualifiers, stock per branch (never below zero) and versioned price lists.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('vehicles', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    make: { type: DataTypes.STRING(60), allowNull: false },
    model: { type: DataTypes.STRING(80), allowNull: false },
    generation: { type: DataTypes.STRING(80), allowNull: false, defaultValue: '' }, // body / generation, e.g. "Mk2 hatchback"
    body: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    year_from: { type: DataTypes.INTEGER, allowNull: false },
    year_to: { type: DataTypes.INTEGER, allowNull: true }, // null: still built
    engine_code: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    engine_cc: { type: DataTypes.INTEGER, allowNull: true },
    fuel: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' }, // petrol | diesel | hybrid | electric | lpg
    power_kw: { type: DataTypes.INTEGER, allowNull: true },
    drive: { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'FWD' }, // FWD | RWD | AWD
    circuit_split: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'diagonal' }, // front-rear | diagonal
    fluid_grade: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'DOT 4' },
    tyre_size: { type: DataTypes.STRING(30), allowNull: false, defaultValue: '' }, // e.g. 205/55 R16
    kerb_mass_kg: { type: DataTypes.INTEGER, allowNull: true },
    mc_bore_mm: { type: DataTypes.FLOAT, allowNull: true },
    mc_tandem: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    mc_stroke_mm: { type: DataTypes.FLOAT, allowNull: true },
    pedal_ratio: { type: DataTypes.FLOAT, allowNull: true },
    booster_ratio: { type: DataTypes.FLOAT, allowNull: true },
    parking_brake: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'cable' }, // cable | electric
    ...ts,
  })
  await qi.addIndex('vehicles', ['make', 'model', 'year_from'])

  // The questions a technician answers at the car when fitment depends on an option ("front disc 280 or 300 mm?").
  await qi.createTable('vehicle_options', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    vehicle_id: { type: DataTypes.INTEGER, allowNull: false, ...ref('vehicles') },
    key: { type: DataTypes.STRING(60), allowNull: false }, // e.g. front_disc_diameter_mm, parking_brake
    label: { type: DataTypes.STRING(120), allowNull: false },
    question: { type: DataTypes.STRING(240), allowNull: false },
    values: { type: DataTypes.TEXT, allowNull: false }, // JSON [{ value: "300", label: "300 mm" }]
    ...ts,
  })
  await qi.addIndex('vehicle_options', ['vehicle_id', 'key'], { unique: true })

  // Original-equipment brake per axle; `qualifiers` ties a configuration to option values (JSON {key: value}).
  await qi.createTable('vehicle_brakes', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    vehicle_id: { type: DataTypes.INTEGER, allowNull: false, ...ref('vehicles') },
    axle: { type: DataTypes.STRING(8), allowNull: false }, // front | rear
    qualifiers: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' },
    kind: { type: DataTypes.STRING(8), allowNull: false }, // disc | drum
    disc_diameter_mm: { type: DataTypes.FLOAT, allowNull: true },
    disc_thickness_mm: { type: DataTypes.FLOAT, allowNull: true },
    disc_min_thickness_mm: { type: DataTypes.FLOAT, allowNull: true },
    disc_vented: { type: DataTypes.BOOLEAN, allowNull: true },
    drum_diameter_mm: { type: DataTypes.FLOAT, allowNull: true },
    drum_max_diameter_mm: { type: DataTypes.FLOAT, allowNull: true },
    caliper_type: { type: DataTypes.STRING(10), allowNull: true }, // fixed | floating
    piston_diameters_mm: { type: DataTypes.TEXT, allowNull: true }, // JSON number[]: one side for fixed, all for floating
    wheel_cylinder_bore_mm: { type: DataTypes.FLOAT, allowNull: true },
    max_runout_mm: { type: DataTypes.FLOAT, allowNull: true },
    max_thickness_variation_mm: { type: DataTypes.FLOAT, allowNull: true },
    ...ts,
  })
  await qi.addIndex('vehicle_brakes', ['vehicle_id', 'axle'])

  await qi.createTable('parts', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    sku: { type: DataTypes.STRING(40), allowNull: false, unique: true },
    // pad_set | disc | drum | shoe_set | caliper | wheel_cylinder | master_cylinder | hose | fluid | fitting_kit | wear_sensor
    type: { type: DataTypes.STRING(24), allowNull: false },
    product_line: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
    description: { type: DataTypes.STRING(300), allowNull: false },
    specs: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' }, // JSON, zod-validated per type
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' }, // active | discontinued
    ...ts,
  })
  await qi.addIndex('parts', ['type'])

  await qi.createTable('part_oe_numbers', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    part_id: { type: DataTypes.INTEGER, allowNull: false, ...ref('parts') },
    oe_number: { type: DataTypes.STRING(40), allowNull: false }, // as printed
    oe_normalised: { type: DataTypes.STRING(40), allowNull: false }, // upper case, no spaces/dashes/dots
    maker: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
  })
  await qi.addIndex('part_oe_numbers', ['oe_normalised'])
  await qi.addIndex('part_oe_numbers', ['part_id'])

  // An old SKU replaced by a newer part: searching the old one finds the new one and says so.
  await qi.createTable('supersessions', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    old_sku: { type: DataTypes.STRING(40), allowNull: false, unique: true },
    new_part_id: { type: DataTypes.INTEGER, allowNull: false, ...ref('parts') },
    note: { type: DataTypes.STRING(240), allowNull: false, defaultValue: '' },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })

  await qi.createTable('fitments', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    vehicle_id: { type: DataTypes.INTEGER, allowNull: false, ...ref('vehicles') },
    part_id: { type: DataTypes.INTEGER, allowNull: false, ...ref('parts') },
    axle: { type: DataTypes.STRING(8), allowNull: false }, // front | rear | (none for fluid: 'all')
    side: { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'pair' }, // left | right | pair
    quantity: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    qualifiers: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' }, // JSON { option key: value }
    note: { type: DataTypes.STRING(240), allowNull: false, defaultValue: '' },
    ...ts,
  })
  await qi.addIndex('fitments', ['vehicle_id'])
  await qi.addIndex('fitments', ['part_id'])

  // Stock can never go below zero: orders decrement with a guarded UPDATE and this CHECK backs it up.
  await ddlRunner(qi)(`CREATE TABLE stock_levels (
    part_id INTEGER NOT NULL REFERENCES parts(id) ON DELETE CASCADE,
    branch_id INTEGER NOT NULL REFERENCES branches(id) ON DELETE CASCADE,
    quantity INTEGER NOT NULL DEFAULT 0 CHECK (quantity >= 0),
    updated_at DATETIME NOT NULL,
    PRIMARY KEY (part_id, branch_id)
  )`)

  // Versioned price lists: exactly one is active; rows are complete copies per version so rollback is exact.
  await qi.createTable('price_lists', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    version: { type: DataTypes.INTEGER, allowNull: false, unique: true },
    label: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    status: { type: DataTypes.STRING(16), allowNull: false }, // active | retired | scheduled
    effective_at: { type: DataTypes.DATE, allowNull: true },
    activated_at: { type: DataTypes.DATE, allowNull: true },
    created_by_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    ...ts,
  })
  await qi.createTable('prices', {
    price_list_id: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, ...ref('price_lists') },
    part_id: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, ...ref('parts') },
    list_price_minor: { type: DataTypes.INTEGER, allowNull: false },
    trade_cost_minor: { type: DataTypes.INTEGER, allowNull: true },
    core_deposit_minor: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    pack_quantity: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
  })
  await qi.addIndex('prices', ['part_id'])
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const t of ['prices', 'price_lists', 'stock_levels', 'fitments', 'supersessions', 'part_oe_numbers', 'parts', 'vehicle_brakes', 'vehicle_options', 'vehicles']) {
    await qi.dropTable(t)
  }
}

import { DataTypes, type QueryInterface } from 'sequelize'

const ts = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
}
const userRef = { references: { model: 'users', key: 'id' } }
const listRef = { references: { model: 'price_lists', key: 'id' } }

/**
 * Price files: the upload and its check (status, progress, counts, how the file is read and which column means
 * what), the staged result of the check one row per part (nothing touches parts or prices until apply), and
 * column mappings remembered per supplier.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('price_uploads', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    // uploaded | parsing | ready | failed | applying | applied | scheduled | rolled_back
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'uploaded' },
    stage: { type: DataTypes.STRING(24), allowNull: true }, // queued | reading | comparing, while parsing
    progress: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 }, // 0..100
    rows_total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    count_new: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    count_changed: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    count_unchanged: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    count_missing: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    count_rejected: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    count_large: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    file_name: { type: DataTypes.STRING(255), allowNull: false }, // as the user named it: shown, never used as a path
    stored_name: { type: DataTypes.STRING(80), allowNull: true }, // server-generated; null once the file is removed
    file_size: { type: DataTypes.INTEGER, allowNull: false },
    file_format: { type: DataTypes.STRING(8), allowNull: false }, // csv | xlsx
    delimiter: { type: DataTypes.STRING(4), allowNull: true }, // , ; \t (CSV only)
    delimiter_chosen: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false }, // false: detected
    decimal_mark: { type: DataTypes.STRING(1), allowNull: false, defaultValue: '.' },
    encoding: { type: DataTypes.STRING(16), allowNull: true }, // utf-8 | utf-8 with BOM
    headers: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' }, // JSON string[]
    mapping: { type: DataTypes.TEXT, allowNull: true }, // JSON ColumnMapping
    supplier_name: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
    error_message: { type: DataTypes.TEXT, allowNull: true },
    base_price_list_id: { type: DataTypes.INTEGER, allowNull: true, ...listRef }, // active version the check compared with
    price_list_id: { type: DataTypes.INTEGER, allowNull: true, ...listRef }, // version this upload created
    previous_price_list_id: { type: DataTypes.INTEGER, allowNull: true, ...listRef }, // active before the apply
    missing_action: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'keep' }, // keep | discontinue
    exclude_rejected: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    effective_at: { type: DataTypes.DATE, allowNull: true },
    created_by_user_id: { type: DataTypes.INTEGER, allowNull: false, ...userRef },
    applied_by_user_id: { type: DataTypes.INTEGER, allowNull: true, ...userRef },
    applied_at: { type: DataTypes.DATE, allowNull: true },
    rolled_back_by_user_id: { type: DataTypes.INTEGER, allowNull: true, ...userRef },
    rolled_back_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  })
  await qi.addIndex('price_uploads', ['status'])

  // One row per part the check found (new, changed, unchanged, missing) and one per refused file row.
  await qi.createTable('price_upload_rows', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    upload_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'price_uploads', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(10), allowNull: false }, // new | changed | unchanged | missing | rejected
    row_number: { type: DataTypes.INTEGER, allowNull: true }, // as a spreadsheet shows it (header = 1); null for missing
    sku: { type: DataTypes.STRING(60), allowNull: true },
    part_id: { type: DataTypes.INTEGER, allowNull: true },
    part_type: { type: DataTypes.STRING(24), allowNull: true },
    description: { type: DataTypes.STRING(300), allowNull: true },
    old_list_minor: { type: DataTypes.INTEGER, allowNull: true },
    new_list_minor: { type: DataTypes.INTEGER, allowNull: true },
    old_trade_minor: { type: DataTypes.INTEGER, allowNull: true },
    new_trade_minor: { type: DataTypes.INTEGER, allowNull: true },
    old_core_minor: { type: DataTypes.INTEGER, allowNull: true },
    new_core_minor: { type: DataTypes.INTEGER, allowNull: true },
    old_pack: { type: DataTypes.INTEGER, allowNull: true },
    new_pack: { type: DataTypes.INTEGER, allowNull: true },
    change_pct: { type: DataTypes.FLOAT, allowNull: true }, // list price change in percent, 2 decimals
    large: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false }, // beyond +/-30 %
    stock: { type: DataTypes.TEXT, allowNull: true }, // JSON { branch code: quantity }
    columns: { type: DataTypes.STRING(300), allowNull: true }, // refused rows: the columns at fault
    reason: { type: DataTypes.TEXT, allowNull: true },
    raw: { type: DataTypes.TEXT, allowNull: true }, // refused rows: the cells as read (JSON)
    // what apply did to the part's status, so a rollback can undo exactly that: created | discontinued | reactivated
    part_status_change: { type: DataTypes.STRING(16), allowNull: true },
  })
  await qi.addIndex('price_upload_rows', ['upload_id', 'kind', 'row_number'])
  await qi.addIndex('price_upload_rows', ['upload_id', 'part_id'])

  await qi.createTable('price_column_mappings', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    supplier_key: { type: DataTypes.STRING(120), allowNull: false, unique: true }, // lower case, trimmed
    supplier_name: { type: DataTypes.STRING(120), allowNull: false },
    mapping: { type: DataTypes.TEXT, allowNull: false },
    delimiter: { type: DataTypes.STRING(4), allowNull: true },
    decimal_mark: { type: DataTypes.STRING(1), allowNull: false, defaultValue: '.' },
    updated_by_user_id: { type: DataTypes.INTEGER, allowNull: true, ...userRef },
    ...ts,
  })

  // The shared rule "exactly one price list is active", held by the database as well as by the apply code.
  await qi.sequelize.query(`CREATE UNIQUE INDEX IF NOT EXISTS price_lists_one_active ON price_lists (status) WHERE status = 'active'`)
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.sequelize.query('DROP INDEX IF EXISTS price_lists_one_active')
  for (const t of ['price_column_mappings', 'price_upload_rows', 'price_uploads']) await qi.dropTable(t)
}

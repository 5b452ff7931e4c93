import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * The owner's money and decisions:
 * - a line's price may be stated with tax included (`tax_included`): from here on `unit_price_minor` and
 *   `amount_minor` hold the amounts *as stated* (before tax, or with tax when `tax_included`); every line before
 *   this migration was stated before tax, so nothing it holds changes meaning;
 * - a garage may show and enter prices with tax, end part prices on a chosen ending (e.g. .99), and pass core
 *   deposits on to the owner (otherwise it absorbs them);
 * - a declined required line keeps the owner's signed acknowledgement: the statement shown, the name, the
 *   time, the address and the browser;
 * - a core deposit passed on records the refund due to the owner when the distributor accepts the old unit;
 * - core deposits carry no tax: quotes still being written are brought under that rule (sent ones stay as sent).
 */
export async function up(qi: QueryInterface): Promise<void> {
  const { BOOLEAN, INTEGER, STRING, TEXT, DATE } = DataTypes
  await qi.addColumn('garage_settings', 'prices_include_tax', { type: BOOLEAN, allowNull: false, defaultValue: false })
  await qi.addColumn('garage_settings', 'part_price_ending', { type: INTEGER, allowNull: true })
  await qi.addColumn('garage_settings', 'core_deposits_passed_on', { type: BOOLEAN, allowNull: false, defaultValue: false })

  await qi.addColumn('quote_lines', 'tax_included', { type: BOOLEAN, allowNull: false, defaultValue: false })
  await qi.addColumn('quote_lines', 'decline_statement', { type: TEXT, allowNull: true })
  await qi.addColumn('quote_lines', 'decline_signed_name', { type: STRING(120), allowNull: true })
  await qi.addColumn('quote_lines', 'decline_signed_at', { type: DATE, allowNull: true })
  await qi.addColumn('quote_lines', 'decline_address', { type: STRING(64), allowNull: true })
  await qi.addColumn('quote_lines', 'decline_user_agent', { type: STRING(300), allowNull: true })
  await qi.addColumn('quote_lines', 'core_refund_minor', { type: INTEGER, allowNull: false, defaultValue: 0 })
  await qi.addColumn('quote_lines', 'core_refund_recorded_at', { type: DATE, allowNull: true })

  await qi.sequelize.query(`UPDATE quote_lines SET tax_bp = 0
    WHERE kind = 'core_deposit' AND quote_id IN (SELECT id FROM quotes WHERE status = 'draft')`)
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const c of ['core_refund_recorded_at', 'core_refund_minor', 'decline_user_agent', 'decline_address', 'decline_signed_at', 'decline_signed_name', 'decline_statement', 'tax_included']) {
    await qi.removeColumn('quote_lines', c)
  }
  for (const c of ['core_deposits_passed_on', 'part_price_ending', 'prices_include_tax']) await qi.removeColumn('garage_settings', c)
}

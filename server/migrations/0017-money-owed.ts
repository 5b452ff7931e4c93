import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * A trade account's stop can be lifted by the distributor admin for a while, with a reason: the last day the lift
 * holds (local calendar day) and why. The stop itself is worked out from the ledger each time, so it ends by
 * itself once the garage pays.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('organisations', 'stop_lifted_until', { type: DataTypes.STRING(10), allowNull: true })
  await qi.addColumn('organisations', 'stop_lift_reason', { type: DataTypes.STRING(300), allowNull: true })
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('organisations', 'stop_lift_reason')
  await qi.removeColumn('organisations', 'stop_lifted_until')
}

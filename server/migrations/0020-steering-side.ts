import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * The side of a catalogued vehicle the steering wheel is on ('left' or 'right'), which puts the master cylinder on
 * that side of the bulkhead and so sets the job card's bleeding order. Left empty (unknown) for vehicles already
 * catalogued: the job card says so rather than guess.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('vehicles', 'steering_side', { type: DataTypes.STRING(5), allowNull: true })
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('vehicles', 'steering_side')
}

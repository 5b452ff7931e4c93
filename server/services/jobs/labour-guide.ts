/**
 * The labour guide: hours per vehicle and operation (the distributor's guide, kept by counter staff or the
 * admin), and a garage's own hours for an operation, which take its place for that garage. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { Vehicle } from '../../models/catalogue'
import { LabourTime } from '../../models/jobs'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { LABOUR_OPERATIONS, LABOUR_OPERATION_LABELS, type LabourOperation } from '../../../shared/utils/jobs/labour'
import type { LabourTimeView } from '../../../shared/types/jobs'
import { invalidInput } from '../errors'

/** Hours (hundredths) per operation for a vehicle as a garage works: its own hours over the guide's. */
export async function guideFor(vehicleId: number, organisationId: number | null, t?: Transaction): Promise<Partial<Record<LabourOperation, number>>> {
  const rows = await LabourTime.findAll({
    where: { vehicleId, [Op.or]: [{ organisationId: null }, ...(organisationId ? [{ organisationId }] : [])] }, transaction: t,
  })
  const out: Partial<Record<LabourOperation, number>> = {}
  for (const r of rows.filter((x) => x.organisationId === null)) out[r.operation as LabourOperation] = r.hoursHundredths
  for (const r of rows.filter((x) => x.organisationId !== null)) out[r.operation as LabourOperation] = r.hoursHundredths
  return out
}

/** The labour times of a vehicle (one operation or all), as the caller's garage works them. */
export async function labourTimes(vehicleId: number, organisationId: number | null, operation?: LabourOperation): Promise<LabourTimeView[]> {
  const rows = await LabourTime.findAll({
    where: { vehicleId, ...(operation ? { operation } : {}), [Op.or]: [{ organisationId: null }, ...(organisationId ? [{ organisationId }] : [])] },
  })
  return LABOUR_OPERATIONS.filter((op) => rows.some((r) => r.operation === op)).map((op) => {
    const guide = rows.find((r) => r.operation === op && r.organisationId === null)
    const own = rows.find((r) => r.operation === op && r.organisationId !== null)
    const use = own ?? guide!
    return { vehicleId, operation: op, label: LABOUR_OPERATION_LABELS[op], hours: use.hoursHundredths / 100, source: own ? 'garage' : 'guide', guideHours: guide ? guide.hoursHundredths / 100 : null }
  })
}

/**
 * Sets the hours of one operation: the guide's (organisationId null) or a garage's own; `hours` null removes a
 * garage's own hours (the guide's apply again). Audited.
 */
export async function setLabourTime(
  input: { vehicleId: number; operation: LabourOperation; hours: number | null }, organisationId: number | null, actorUserId: number,
): Promise<LabourTimeView[]> {
  const vehicle = await Vehicle.findByPk(input.vehicleId, { attributes: ['id'] })
  if (!vehicle) throw invalidInput({ vehicleId: 'That vehicle is not in the catalogue.' })
  if (input.hours === null && organisationId === null) throw invalidInput({ hours: 'The guide needs hours for the operation.' })
  await withWrite(async (t) => {
    const where = { vehicleId: input.vehicleId, operation: input.operation, organisationId }
    const row = await LabourTime.findOne({ where, transaction: t })
    if (input.hours === null) await row?.destroy({ transaction: t })
    else if (row) await row.update({ hoursHundredths: Math.round(input.hours * 100), updatedByUserId: actorUserId }, { transaction: t })
    else await LabourTime.create({ ...where, hoursHundredths: Math.round(input.hours * 100), updatedByUserId: actorUserId }, { transaction: t })
    await audit(t, { actorUserId, organisationId, action: organisationId ? 'labourTime.own' : 'labourTime.guide', entity: 'vehicle', entityId: input.vehicleId, changes: { operation: input.operation, hours: input.hours } })
  })
  return labourTimes(input.vehicleId, organisationId, input.operation)
}

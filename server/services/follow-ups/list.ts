/** The garage's follow-ups, one page at a time: what is waiting (soonest due first), sent, held or stopped. Plain Node. */
import type { WhereOptions } from 'sequelize'
import { FollowUp, GarageCustomer, GarageVehicle } from '../../models/garage-vehicles'
import { pageOf } from '../../utils/page'
import type { FollowUpListQuery } from '../../../shared/schemas/garage-vehicles'
import type { FollowUpView } from '../../../shared/types/garage-vehicles'
import type { Page } from '../../../shared/types/page'
import { scheduleFollowUps } from './schedule'
import { followUpView } from './views'

const STATUS_WHERE: Record<FollowUpListQuery['status'], WhereOptions> = {
  due: { status: 'scheduled' },
  scheduled: { status: 'scheduled' },
  sent: { status: ['sent', 'mail_failed'] },
  held: { status: 'held' },
  stopped: { status: 'stopped' },
  all: {},
}

export async function listFollowUps(organisationId: number, query: FollowUpListQuery): Promise<Page<FollowUpView>> {
  await scheduleFollowUps(organisationId)
  const waiting = query.status === 'due' || query.status === 'scheduled'
  return pageOf(query, (window) => FollowUp.findAndCountAll({
    where: { organisationId, ...STATUS_WHERE[query.status] },
    include: [{ model: GarageVehicle, as: 'garageVehicle', include: [{ model: GarageCustomer, as: 'customer' }] }],
    order: waiting ? [['dueAt', 'ASC'], ['id', 'ASC']] : [['dueAt', 'DESC'], ['id', 'DESC']], ...window,
  }), (rows) => rows.map((f) => followUpView(f, f.garageVehicle ?? null, f.garageVehicle?.customer ?? null)))
}

/**
 * Declined safety work on record: every line marked required that an owner declined with a signed
 * acknowledgement, newest first, for a vehicle's history (by the catalogue vehicle or the registration, spaces
 * and case ignored) and for follow-up reminders, which treat it sooner. Only the garage's own quotes.
 */
import { Op, Sequelize, type WhereOptions } from 'sequelize'
import { Quote, QuoteLine } from '../../models/quotes'
import { pageOf } from '../../utils/page'
import type { DeclinedWorkQuery } from '../../../shared/schemas/quotes'
import type { DeclinedSafetyWork } from '../../../shared/types/quotes'
import type { Page } from '../../../shared/types/page'
import { acknowledgementOf } from './garage-view'
import { quoteReference } from './references'

/** A registration as it is compared: capitals, no spaces ("ng19 ktv" and "NG19KTV" are one plate). */
export const plateKey = (registration: string) => registration.toUpperCase().replace(/\s+/g, '')

function quoteWhere(organisationId: number, query: DeclinedWorkQuery): WhereOptions {
  const where: WhereOptions = { organisationId }
  if (query.vehicleId) Object.assign(where, { vehicleId: query.vehicleId })
  if (query.registration) {
    Object.assign(where, {
      [Op.and]: [Sequelize.where(Sequelize.fn('replace', Sequelize.fn('upper', Sequelize.col('quote.registration')), ' ', ''), plateKey(query.registration))],
    })
  }
  return where
}

export function declinedSafetyWork(organisationId: number, query: DeclinedWorkQuery): Promise<Page<DeclinedSafetyWork>> {
  return pageOf(query, (window) => QuoteLine.findAndCountAll({
    where: { ownerDecision: 'declined', recommendation: 'required', declineSignedAt: { [Op.ne]: null } },
    include: [{ model: Quote, as: 'quote', required: true, where: quoteWhere(organisationId, query) }],
    order: [['declineSignedAt', 'DESC'], ['id', 'DESC']],
    ...window,
  }), (rows) => rows.map((l) => {
    const q = (l as QuoteLine & { quote: Quote }).quote
    return {
      quoteId: q.id, reference: quoteReference(q), vehicleId: q.vehicleId ?? null, registration: q.registration ?? '',
      lineId: l.id, description: l.description, reason: l.reason ?? null, acknowledgement: acknowledgementOf(l)!,
    }
  }))
}

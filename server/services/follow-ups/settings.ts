/**
 * A garage's follow-up weeks: how long after the owner declined an advised line (default 8 weeks) or a required
 * one (default 2: it is a safety matter) the reminder is due. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { FollowUpSettings } from '../../models/garage-vehicles'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { FollowUpSettingsInput } from '../../../shared/schemas/garage-vehicles'
import type { FollowUpSettingsView } from '../../../shared/types/garage-vehicles'

export const DEFAULT_WEEKS: FollowUpSettingsView = { advisedWeeks: 8, requiredWeeks: 2 }

export async function followUpWeeks(organisationId: number, t?: Transaction): Promise<FollowUpSettingsView> {
  const row = await FollowUpSettings.findByPk(organisationId, { transaction: t })
  return row ? { advisedWeeks: row.advisedWeeks, requiredWeeks: row.requiredWeeks } : { ...DEFAULT_WEEKS }
}

export function updateFollowUpWeeks(actorUserId: number, organisationId: number, input: FollowUpSettingsInput): Promise<FollowUpSettingsView> {
  return withWrite(async (t) => {
    const before = await followUpWeeks(organisationId, t)
    const after = { ...before, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) } as FollowUpSettingsView
    await FollowUpSettings.upsert({ organisationId, ...after, updatedAt: new Date() }, { transaction: t })
    await audit(t, { actorUserId, organisationId, action: 'followUp.settings', entity: 'organisation', entityId: organisationId, changes: { before, after } })
    return after
  })
}

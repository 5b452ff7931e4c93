/**
 * GET /api/admin/account-reminders?garageId=&kind=statement|overdue&page=&pageSize= -> Page<AccountReminderView>: the
 * monthly statements and overdue reminders e-mailed to garages (to whom, about what, sent or why not), newest first.
 * 401; 403 without `accountReminders.view` (the distributor admin); 422 bad query.
 */
import { AccountReminderListQuerySchema } from '#shared/schemas/money-owed'
import { listAccountReminders } from '../../services/account-reminders/list'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'accountReminders.view')
  return listAccountReminders(queryWith(event, AccountReminderListQuerySchema))
})

/**
 * POST /api/account/mfa/enrolment { code? } -> EnrolmentView { secret, otpauthUri, qrCode, account }: starts setting
 * up an authenticator app (the QR code is made here, nothing fetched). Moving an existing factor to a new app needs a
 * current `code` first (422 on `code` otherwise). 401; 403 for roles without two-step sign-in (technicians); 429.
 */
import { EnrolmentStartSchema } from '#shared/schemas/auth'
import type { EnrolmentView } from '#shared/types/second-factor'
import { startAccountEnrolment } from '../../../../services/account-second-factor'

export default defineEventHandler(async (event): Promise<EnrolmentView> => {
  const { user } = requireAuth(event)
  const { code } = await bodyWith(event, EnrolmentStartSchema)
  return startAccountEnrolment(user, code, clientAddress(event))
})

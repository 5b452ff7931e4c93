/** Two-step sign-in as the app sees it: the sign-in answers, an enrolment to show, a person's state. */
import type { OrgStatus, SessionUser } from './accounts'

/** What an authenticator app needs: the secret as a QR code (a PNG data URL made by the server) and as text. */
export interface EnrolmentView {
  secret: string
  otpauthUri: string
  qrCode: string
  /** the account name the app shows (the person's e-mail) */
  account: string
}

/** A complete sign-in (the session is set). `recoveryCodes` only right after enrolling, shown once. */
export interface SignedIn {
  user: SessionUser
  organisationStatus: OrgStatus
  recoveryCodes?: string[]
}

/** The password was right; a code is needed next (POST /api/auth/mfa). `enrolment` when the person must set up an app first. */
export interface SecondStepNeeded {
  mfaRequired: true
  enrolment?: EnrolmentView
}

export type SignInAnswer = SignedIn | SecondStepNeeded

export interface SecondFactorStatus {
  /** the role may use two-step sign-in */
  allowed: boolean
  /** the role must use it (distributor staff) */
  required: boolean
  enrolled: boolean
  enrolledAt: string | null
  recoveryCodesLeft: number
}

/**
 * A garage's trade application: applying (public, with a proof-of-trade document), where it stands for the garage,
 * and the distributor admin's decision. Nothing of a refused application is kept: no organisation, no person, no
 * file. Plain Node.
 */
import { rm } from 'node:fs/promises'
import type { IncomingMessage } from 'node:http'
import { UniqueConstraintError } from 'sequelize'
import { Organisation, User } from '../models/accounts'
import { ProofDocument } from '../models/accounts-extra'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { appLink, sendMail } from '../utils/mail'
import { TradeApplicationSchema, type DecisionInput, type TradeApplicationInput } from '../../shared/schemas/accounts'
import { fieldMessages } from '../../shared/utils/field-messages'
import type { ApplicationStatusView, TradeAccountDetail } from '../../shared/types/trade-accounts'
import { accountMail } from './account-mail'
import { chosenTier } from './discount-tiers'
import { conflict, invalidInput } from './errors'
import { hashPasswordOutsideNitro } from './password'
import { assertStrongPassword } from './password-strength'
import { securityEvent } from './security-log'
import { admitApplication } from './throttle'
import { moveIntoStore, newStoredName } from './proof-store'
import { checkProofFile, MISSING_PROOF, receiveProof, type CheckedProof } from './proof-upload'
import { commitGarageChange, tellGarage, termsOf } from './trade-account-changes'
import { chosenBranch } from './orders/home-branch'
import { iso, latestProof, tierLabel, tradeAccountDetail, type Garage } from './trade-accounts'

/** The one answer to an application taken, whether or not its e-mail already had an account. */
export const APPLICATION_RECEIVED = {
  status: 'pending',
  message: 'Application received. We have e-mailed the address you gave; the distributor checks each application by hand and e-mails the decision.',
} as const

/**
 * Takes an application from its multipart form: the garage (pending), its manager (who may sign in to follow
 * it), the document under a name of our own, and the audit entry, in one transaction; then e-mails the applicant
 * and the distributor admins. 422/413/415 name the field at fault; temporary and stored files go on every failure;
 * 429 once the address has sent too many. An e-mail that already has an account gets the same answer after the same
 * work (its password hashed too), nothing is created, and the owner of the address is told by e-mail instead: the
 * answer never says which addresses have accounts.
 */
export async function submitTradeApplication(req: IncomingMessage, uploadsDir: string, address: string): Promise<typeof APPLICATION_RECEIVED> {
  try {
    await admitApplication(address)
  } catch (err) {
    req.resume() // the answer is sent on a connection that has read the form
    throw err
  }
  const upload = await receiveProof(req, uploadsDir)
  let storedPath: string | null = null
  try {
    const parsed = TradeApplicationSchema.safeParse(upload.fields)
    if (!parsed.success) {
      // name a missing document in the same answer, so the form shows every problem at once
      throw invalidInput({ ...fieldMessages(parsed.error.issues), ...(upload.file ? {} : { proof: MISSING_PROOF }) })
    }
    const input = parsed.data
    const proof = await checkProofFile(upload.file)
    assertStrongPassword(input.password, 'password', [input.email, input.contactName, input.businessName])
    const passwordHash = await hashPasswordOutsideNitro(input.password)
    if (await User.findOne({ where: { email: input.email }, attributes: ['id'] })) return await knownEmail(input.email, address)
    const storedName = newStoredName(proof.ext)
    storedPath = await moveIntoStore(upload.file!.path, uploadsDir, storedName)
    const created = await createApplication(input, passwordHash, { ...proof, storedName })
    if (!created) return await knownEmail(input.email, address) // the same e-mail applied at the same moment
    storedPath = null // committed: the file belongs to the application now
    const { org, user } = created

    await sendMail({ to: user.email, ...accountMail.applicationReceived({ contactName: user.name, businessName: org.name, statusUrl: appLink('/sign-in') }) })
    const admins = await User.findAll({ where: { role: 'distributor_admin', status: 'active' }, attributes: ['email'] })
    if (admins.length) {
      const notice = accountMail.applicationNotice({ businessName: org.name, contactName: org.contactName, email: org.email, reviewUrl: appLink(`/admin/applications/${org.id}`) })
      await sendMail({ to: admins.map((a) => a.email), ...notice })
    }
    return APPLICATION_RECEIVED
  } finally {
    if (storedPath) await rm(storedPath, { force: true })
    await upload.cleanup()
  }
}

/** An application with an e-mail that already has an account: nothing is kept; the address's owner is told. */
async function knownEmail(email: string, address: string): Promise<typeof APPLICATION_RECEIVED> {
  securityEvent('application.known_email', { email, address }, 'info')
  await sendMail({ to: email, ...accountMail.applicationWithKnownEmail({ signInUrl: appLink('/sign-in'), resetUrl: appLink('/forgot-password') }) })
  return APPLICATION_RECEIVED
}

/** The garage and its manager, or null when the e-mail was taken meanwhile. */
async function createApplication(input: TradeApplicationInput, passwordHash: string, proof: CheckedProof & { storedName: string }) {
  return withWrite(async (t) => {
    const org = await Organisation.create({
      kind: 'garage', name: input.businessName, status: 'pending', tradingAddress: input.tradingAddress,
      taxNumber: input.taxNumber, contactName: input.contactName, phone: input.phone, email: input.email,
    }, { transaction: t })
    const user = await User.create({
      organisationId: org.id, email: input.email, name: input.contactName, phone: input.phone,
      role: 'garage_manager', passwordHash, status: 'active',
    }, { transaction: t })
    await ProofDocument.create({
      organisationId: org.id, storedName: proof.storedName, originalName: proof.originalName, mime: proof.mime, sizeBytes: proof.size,
    }, { transaction: t })
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, action: 'tradeApplication.submitted', entity: 'organisation', entityId: org.id,
      changes: { status: { from: null, to: 'pending' }, document: { from: null, to: proof.originalName } },
    })
    return { org, user }
  }).catch((err) => {
    if (err instanceof UniqueConstraintError) return null
    throw err
  })
}

/** Where the caller's own garage's application stands: the one thing a garage that is not approved may read. */
export async function applicationStatus(org: Organisation): Promise<ApplicationStatusView> {
  const doc = await latestProof(org.id)
  return {
    businessName: org.name, status: org.status, submittedAt: iso(org.createdAt)!,
    decidedAt: iso(org.decidedAt), decisionReason: org.decisionReason ?? null,
    document: doc ? { originalName: doc.originalName, sizeBytes: doc.sizeBytes } : null,
  }
}

const DECIDED = 'This application has already been decided.'

/**
 * Approves (with a tier and payment terms) or rejects (with a reason the garage reads) a pending application;
 * 409 once it is decided, also when two admins decide at once. The garage is e-mailed either way.
 */
export async function decideApplication(garage: Garage, input: DecisionInput, actorId: number): Promise<TradeAccountDetail> {
  if (garage.status !== 'pending') throw conflict(`This application has already been decided (${garage.status}).`)
  return input.decision === 'approve' ? approve(garage, input, actorId) : reject(garage, input.reason, actorId)
}

async function approve(garage: Garage, input: Extract<DecisionInput, { decision: 'approve' }>, actorId: number): Promise<TradeAccountDetail> {
  const tier = await chosenTier(input.tierId)
  const branch = await chosenBranch(input.homeBranchId)
  const onAccount = input.terms === 'account'
  const values = {
    status: 'approved' as const, tierId: tier.id, paymentTerms: input.terms, homeBranchId: branch.id,
    creditLimitMinor: onAccount ? input.creditLimitMinor! : 0, paymentDays: onAccount ? input.paymentDays! : 0,
    decisionReason: input.reason || null, decidedAt: new Date(),
  }
  const fresh = await commitGarageChange(garage, values, {
    action: 'tradeApplication.approved', actorId, stale: DECIDED,
    changes: {
      status: { from: 'pending', to: 'approved' }, tier: { from: null, to: tierLabel(tier) }, terms: { from: null, to: values.paymentTerms },
      creditLimitMinor: { from: 0, to: values.creditLimitMinor }, paymentDays: { from: 0, to: values.paymentDays },
      homeBranch: { from: null, to: branch.name },
      ...(input.reason ? { note: input.reason } : {}),
    },
  })
  await tellGarage(fresh, accountMail.approved({
    businessName: fresh.name, tierName: tier.name, percentBp: tier.percentBp, signInUrl: appLink('/sign-in'), terms: termsOf(fresh),
  }))
  return tradeAccountDetail(fresh)
}

async function reject(garage: Garage, reason: string, actorId: number): Promise<TradeAccountDetail> {
  const fresh = await commitGarageChange(garage, { status: 'rejected', decisionReason: reason, decidedAt: new Date() }, {
    action: 'tradeApplication.rejected', actorId, stale: DECIDED, changes: { status: { from: 'pending', to: 'rejected' }, reason },
  })
  await tellGarage(fresh, accountMail.rejected({ businessName: fresh.name, reason: fresh.decisionReason ?? '', applyUrl: appLink('/apply') }))
  return tradeAccountDetail(fresh)
}

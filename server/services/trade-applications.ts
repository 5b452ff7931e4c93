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
import { moveIntoStore, newStoredName } from './proof-store'
import { checkProofFile, MISSING_PROOF, receiveProof, type CheckedProof } from './proof-upload'
import { commitGarageChange, tellGarage, termsOf } from './trade-account-changes'
import { chosenBranch } from './orders/home-branch'
import { iso, latestProof, tierLabel, tradeAccountDetail, type Garage } from './trade-accounts'

const DUPLICATE = 'An account with this e-mail already exists. Sign in, or use another address.'

/**
 * Takes an application from its multipart form: the garage (pending), its manager (who may sign in to follow
 * it), the document under a name of our own, and the audit entry, in one transaction; then e-mails the applicant
 * and the distributor admins. 422/413/415 name the field at fault; temporary and stored files go on every failure.
 */
export async function submitTradeApplication(req: IncomingMessage, uploadsDir: string): Promise<{ id: number; status: string }> {
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
    if (await User.findOne({ where: { email: input.email }, attributes: ['id'] })) throw invalidInput({ email: DUPLICATE })
    const passwordHash = await hashPasswordOutsideNitro(input.password)
    const storedName = newStoredName(proof.ext)
    storedPath = await moveIntoStore(upload.file!.path, uploadsDir, storedName)
    const { org, user } = await createApplication(input, passwordHash, { ...proof, storedName })
    storedPath = null // committed: the file belongs to the application now

    await sendMail({ to: user.email, ...accountMail.applicationReceived({ contactName: user.name, businessName: org.name, statusUrl: appLink('/sign-in') }) })
    const admins = await User.findAll({ where: { role: 'distributor_admin', status: 'active' }, attributes: ['email'] })
    if (admins.length) {
      const notice = accountMail.applicationNotice({ businessName: org.name, contactName: org.contactName, email: org.email, reviewUrl: appLink(`/admin/applications/${org.id}`) })
      await sendMail({ to: admins.map((a) => a.email), ...notice })
    }
    return { id: org.id, status: org.status }
  } finally {
    if (storedPath) await rm(storedPath, { force: true })
    await upload.cleanup()
  }
}

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
    if (err instanceof UniqueConstraintError) throw invalidInput({ email: DUPLICATE })
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

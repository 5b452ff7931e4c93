/**
 * POST /api/trade-applications (multipart/form-data)
 *   fields businessName, tradingAddress, taxNumber, contactName, phone, email, password; file `proof`
 * -> 201 { id, status: "pending" }. Public: a garage applies before it has an account.
 * Errors name the field: 422 (missing/invalid fields, short password, e-mail already used, no file),
 * 413 (file over 10 MB), 415 (empty, not PDF/JPEG/PNG by its bytes, or not what its name says).
 * Nothing is kept on any error: no organisation, no user, no file (temporary files are removed on every path).
 */
import { rm } from 'node:fs/promises'
import { UniqueConstraintError } from 'sequelize'
import { TradeApplicationSchema } from '#shared/schemas/accounts'
import { Organisation, User } from '../../models/accounts'
import { ProofDocument } from '../../models/accounts-extra'
import { checkProofFile, MISSING_PROOF, moveIntoStore, newStoredName, parseProofUpload } from '../../services/proof-upload'
import { accountMail } from '../../services/account-mail'

const DUPLICATE = 'An account with this e-mail already exists. Sign in, or use another address.'

export default defineEventHandler(async (event) => {
  const uploadsDir = String(useRuntimeConfig(event).uploadsDir)
  const upload = await parseProofUpload(event.node.req, uploadsDir)
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

    const passwordHash = await hashPassword(input.password)
    const storedName = newStoredName(proof.ext)
    storedPath = await moveIntoStore(upload.file!.filepath, uploadsDir, storedName)

    const { org, user } = await withWrite(async (t) => {
      const org = await Organisation.create({
        kind: 'garage', name: input.businessName, status: 'pending', tradingAddress: input.tradingAddress,
        taxNumber: input.taxNumber, contactName: input.contactName, phone: input.phone, email: input.email,
      }, { transaction: t })
      const user = await User.create({
        organisationId: org.id, email: input.email, name: input.contactName, phone: input.phone,
        role: 'garage_manager', passwordHash, status: 'active',
      }, { transaction: t })
      await ProofDocument.create({
        organisationId: org.id, storedName, originalName: proof.originalName, mime: proof.mime, sizeBytes: proof.size,
      }, { transaction: t })
      await audit(t, {
        actorUserId: user.id, organisationId: org.id, action: 'application.submitted', entity: 'organisation', entityId: org.id,
        changes: { status: { from: null, to: 'pending' }, document: { from: null, to: proof.originalName } },
      })
      return { org, user }
    }).catch((err) => {
      if (err instanceof UniqueConstraintError) throw invalidInput({ email: DUPLICATE })
      throw err
    })
    storedPath = null // committed: the file belongs to the application now

    const mine = accountMail.applicationReceived({ contactName: user.name, businessName: org.name, statusUrl: appLink('/sign-in') })
    await sendMail({ to: user.email, ...mine })
    const admins = await User.findAll({ where: { role: 'distributor_admin', status: 'active' }, attributes: ['email'] })
    if (admins.length) {
      const notice = accountMail.applicationNotice({ businessName: org.name, contactName: org.contactName, email: org.email, reviewUrl: appLink(`/admin/applications/${org.id}`) })
      await sendMail({ to: admins.map((a) => a.email), ...notice })
    }
    setResponseStatus(event, 201)
    return { id: org.id, status: org.status }
  } finally {
    if (storedPath) await rm(storedPath, { force: true })
    await upload.cleanup()
  }
})

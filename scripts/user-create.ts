/**
 * npm run user:create -- --email E --name N --role distributor_admin|counter_staff --password P [--totp-secret BASE32]
 * Creates distributor staff on a fresh install (creating the distributor organisation if there is none). Distributor
 * staff sign in with two steps: without --totp-secret they set up an authenticator app at their first sign-in; with
 * it (automation) they are set up with that secret, sealed with the server's key (NUXT_MFA_KEY, or the session
 * password), which must then be in the environment.
 */
import { parseArgs } from 'node:util'
import { z } from 'zod'
import { closeDb, getDb, withWrite } from '../server/utils/db'
import { migrateUp } from '../server/utils/migrate'
import { initModels, Organisation, User } from '../server/models/index'
import { SecondFactor } from '../server/models/second-factor'
import { sealSecret } from '../server/services/mfa-secrets'
import { hashPasswordOutsideNitro, passwordProblem } from '../server/services/password'
import { weakPasswordReason } from '../server/services/password-strength'
import { EmailSchema } from '../shared/schemas/auth'

const fail = (msg: string): never => {
  console.error(`user:create: ${msg}`)
  process.exit(1)
}

let values: Record<string, string | undefined>
try {
  ({ values } = parseArgs({
    options: {
      email: { type: 'string' }, name: { type: 'string' }, role: { type: 'string' }, password: { type: 'string' }, organisation: { type: 'string' },
      'totp-secret': { type: 'string' },
    },
    strict: true,
  }))
} catch (err) {
  fail(`${(err as Error).message}\nUsage: npm run user:create -- --email E --name N --role distributor_admin|counter_staff --password P [--totp-secret BASE32]`)
}

const Args = z.object({
  email: z.string({ message: '--email is required.' }).pipe(EmailSchema),
  name: z.string({ message: '--name is required.' }).trim().min(2, '--name must be at least 2 characters.').max(120),
  role: z.enum(['distributor_admin', 'counter_staff'], { message: '--role must be distributor_admin or counter_staff.' }),
  password: z.string({ message: '--password is required.' }),
  organisation: z.string().trim().min(2).max(160).optional(),
  // base32 (RFC 4648), at least 128 bits as RFC 4226 requires of a shared secret: 26 characters
  'totp-secret': z.string().trim().toUpperCase().regex(/^[A-Z2-7]{26,103}=*$/, '--totp-secret must be base32 (A-Z, 2-7) of at least 26 characters (128 bits).').optional(),
})
const parsed = Args.safeParse(values!)
if (!parsed.success) fail(parsed.error.issues.map((i) => i.message).join('\n'))
const args = parsed.data!
const weak = passwordProblem(args.password) ?? weakPasswordReason(args.password, [args.email, args.name])
if (weak) fail(weak)
let sealed: string | null = null
if (args['totp-secret']) {
  try {
    sealed = sealSecret(args['totp-secret'].replace(/=+$/, ''))
  } catch (err) {
    fail((err as Error).message)
  }
}

await migrateUp(getDb())
initModels(getDb())
if (await User.findOne({ where: { email: args.email } })) fail(`a user with e-mail ${args.email} already exists.`)
const passwordHash = await hashPasswordOutsideNitro(args.password)
const user = await withWrite(async (t) => {
  let org = await Organisation.findOne({ where: { kind: 'distributor' }, transaction: t })
  org ??= await Organisation.create({ kind: 'distributor', name: args.organisation ?? 'Distributor', status: 'approved' }, { transaction: t })
  const created = await User.create({ organisationId: org.id, email: args.email, name: args.name, role: args.role, passwordHash, status: 'active' }, { transaction: t })
  if (sealed) await SecondFactor.create({ userId: created.id, secret: sealed, enrolledAt: new Date() }, { transaction: t })
  return created
})
console.log(`Created ${args.role} ${user.email} (id ${user.id}).${sealed ? ' Two-step sign-in is set up with the given secret.' : ' They set up two-step sign-in at their first sign-in.'}`)
await closeDb()

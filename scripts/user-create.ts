/**
 * npm run user:create -- --email E --name N --role distributor_admin|counter_staff --password P
 * Creates distributor staff on a fresh install (creating the distributor organisation if there is none).
 */
import { parseArgs } from 'node:util'
import { z } from 'zod'
import { closeDb, getDb, withWrite } from '../server/utils/db'
import { migrateUp } from '../server/utils/migrate'
import { initModels, Organisation, User } from '../server/models/index'
import { hashPasswordOutsideNitro, passwordProblem } from '../server/services/password'
import { EmailSchema } from '../shared/schemas/auth'

const fail = (msg: string): never => {
  console.error(`user:create: ${msg}`)
  process.exit(1)
}

let values: Record<string, string | undefined>
try {
  ({ values } = parseArgs({
    options: { email: { type: 'string' }, name: { type: 'string' }, role: { type: 'string' }, password: { type: 'string' }, organisation: { type: 'string' } },
    strict: true,
  }))
} catch (err) {
  fail(`${(err as Error).message}\nUsage: npm run user:create -- --email E --name N --role distributor_admin|counter_staff --password P`)
}

const Args = z.object({
  email: z.string({ message: '--email is required.' }).pipe(EmailSchema),
  name: z.string({ message: '--name is required.' }).trim().min(2, '--name must be at least 2 characters.').max(120),
  role: z.enum(['distributor_admin', 'counter_staff'], { message: '--role must be distributor_admin or counter_staff.' }),
  password: z.string({ message: '--password is required.' }),
  organisation: z.string().trim().min(2).max(160).optional(),
})
const parsed = Args.safeParse(values!)
if (!parsed.success) fail(parsed.error.issues.map((i) => i.message).join('\n'))
const args = parsed.data!
const weak = passwordProblem(args.password)
if (weak) fail(weak)

await migrateUp(getDb())
initModels(getDb())
if (await User.findOne({ where: { email: args.email } })) fail(`a user with e-mail ${args.email} already exists.`)
const passwordHash = await hashPasswordOutsideNitro(args.password)
const user = await withWrite(async (t) => {
  let org = await Organisation.findOne({ where: { kind: 'distributor' }, transaction: t })
  org ??= await Organisation.create({ kind: 'distributor', name: args.organisation ?? 'Distributor', status: 'approved' }, { transaction: t })
  return User.create({ organisationId: org.id, email: args.email, name: args.name, role: args.role, passwordHash, status: 'active' }, { transaction: t })
})
console.log(`Created ${args.role} ${user.email} (id ${user.id}).`)
await closeDb()

/**
 * Demo people and organisations: an invented distributor with two branches and four garages
 * (two approved on different tiers and terms, one pending, one rejected). Idempotent: rows are found by
 * their natural keys (branch code, tier name, organisation name, user e-mail) and updated in place.
 * The distributor's staff come with two-step sign-in set up, on invented secrets that `npm run demo` prints (and
 * `npm run demo:code` turns into the current code), so the demo can be tried without an authenticator app.
 */
import type { Transaction } from 'sequelize'
import { Branch, DiscountTier, Organisation, User } from '../models/accounts'
import { SecondFactor } from '../models/second-factor'
import { sealSecret } from '../services/mfa-secrets'
import type { OrgStatus, PaymentTerms, Role } from '../../shared/types/accounts'
import { hashPasswordOutsideNitro } from '../services/password'

export const DEMO_PASSWORD = 'brake-demo-2026'

export const DEMO_DISTRIBUTOR = 'Kestrel Friction Supply'

/** The demo distributor staff's TOTP secrets (base32, 160 bits; invented for the demo, never for real use). */
export const DEMO_TOTP_SECRETS: Readonly<Record<string, string>> = {
  'rowan.pike@kestrel-friction.test': 'EAQ7SXZJOOEIUR3PQBLVHY6EUYSWMWAB',
  'ines.okafor@kestrel-friction.test': 'AS5HAPZLJ5S7TVA2MU4RO356LYWVZBLA',
  'dev.sandhu@kestrel-friction.test': 'XA3S6C6KBS3CIGJXOCKKQ4WMM2DWTSRD',
}

interface DemoOrg {
  name: string
  kind: 'distributor' | 'garage'
  status: OrgStatus
  tier?: string
  terms?: PaymentTerms
  creditLimitMinor?: number
  paymentDays?: number
  homeBranch?: string
  taxNumber: string
  address: string
  contact: string
  phone: string
  email: string
  reason?: string
  people: DemoPerson[]
}

interface DemoPerson { email: string; name: string; role: Role }

/** An organisation's people by name and role; each signs in as first.last@ its domain. */
function peopleAt(domain: string, roles: Record<string, Role>): DemoPerson[] {
  return Object.entries(roles).map(([name, role]) => ({ email: `${name.toLowerCase().replace(/\s+/g, '.')}@${domain}`, name, role }))
}

export const DEMO_ORGS: DemoOrg[] = [
  {
    name: DEMO_DISTRIBUTOR, kind: 'distributor', status: 'approved', taxNumber: 'GB 900 1234 56',
    address: 'Unit 4, Quarry Lane Trade Park, Northgate NG7 2KF', contact: 'Rowan Pike', phone: '0161 555 0140',
    email: 'trade@kestrel-friction.test',
    people: peopleAt('kestrel-friction.test', { 'Rowan Pike': 'distributor_admin', 'Ines Okafor': 'counter_staff', 'Dev Sandhu': 'counter_staff' }),
  },
  {
    name: 'Millbrook Motor Works', kind: 'garage', status: 'approved', tier: 'Silver', terms: 'account',
    creditLimitMinor: 500_000, paymentDays: 30, homeBranch: 'NGT', taxNumber: 'GB 311 4477 02',
    address: '12 Millbrook Road, Northgate NG3 5TA', contact: 'Hattie Corran', phone: '0161 555 0192',
    email: 'office@millbrook-motors.test',
    people: peopleAt('millbrook-motors.test', { 'Hattie Corran': 'garage_manager', 'Sol Brennan': 'garage_technician', 'Priya Natt': 'garage_technician' }),
  },
  {
    name: 'Tannery Yard Autos', kind: 'garage', status: 'approved', tier: 'Bronze', terms: 'card',
    homeBranch: 'RVS', taxNumber: 'GB 522 9081 33', address: '3 Tannery Yard, Riverside RV1 8PQ',
    contact: 'Marek Dowling', phone: '0161 555 0175', email: 'hello@tannery-yard.test',
    people: peopleAt('tannery-yard.test', { 'Marek Dowling': 'garage_manager', 'Ada Finch': 'garage_technician' }),
  },
  {
    name: 'Ashcombe Car Care', kind: 'garage', status: 'pending', taxNumber: 'GB 733 1200 41',
    address: '88 Ashcombe Parade, Northgate NG9 1LB', contact: 'Lena Voss', phone: '0161 555 0133',
    email: 'lena@ashcombe-carcare.test',
    people: peopleAt('ashcombe-carcare.test', { 'Lena Voss': 'garage_manager' }),
  },
  {
    name: 'Fernside Vehicle Repairs', kind: 'garage', status: 'rejected', taxNumber: 'GB 000 0000 00',
    address: 'Fernside Industrial Estate, Riverside RV4 2DD', contact: 'Colm Ruddy', phone: '0161 555 0108',
    email: 'colm@fernside-repairs.test', reason: 'The tax number could not be verified. Please re-apply with a current registration.',
    people: peopleAt('fernside-repairs.test', { 'Colm Ruddy': 'garage_manager' }),
  },
]

export async function seedAccounts(t: Transaction, log: (s: string) => void): Promise<void> {
  const branches = [
    { code: 'NGT', name: 'Northgate', address: 'Unit 4, Quarry Lane Trade Park, Northgate NG7 2KF' },
    { code: 'RVS', name: 'Riverside', address: '21 Wharf Street, Riverside RV2 6HN' },
  ]
  const branchIds: Record<string, number> = {}
  for (const b of branches) {
    const [row] = await Branch.findOrCreate({ where: { code: b.code }, defaults: b, transaction: t })
    branchIds[b.code] = row.id
  }
  const tiers = [
    { name: 'Standard', percentBp: 0 }, { name: 'Bronze', percentBp: 500 },
    { name: 'Silver', percentBp: 1250 }, { name: 'Gold', percentBp: 2000 },
  ]
  const tierIds: Record<string, number> = {}
  for (const tier of tiers) {
    const [row] = await DiscountTier.findOrCreate({ where: { name: tier.name }, defaults: tier, transaction: t })
    tierIds[tier.name] = row.id
  }
  const hash = await hashPasswordOutsideNitro(DEMO_PASSWORD)
  let enrolled = 0
  for (const o of DEMO_ORGS) {
    const values = {
      kind: o.kind, name: o.name, status: o.status, taxNumber: o.taxNumber, tradingAddress: o.address,
      contactName: o.contact, phone: o.phone, email: o.email,
      tierId: o.tier ? tierIds[o.tier]! : null, paymentTerms: o.terms ?? 'card',
      creditLimitMinor: o.creditLimitMinor ?? 0, paymentDays: o.paymentDays ?? 0,
      homeBranchId: o.homeBranch ? branchIds[o.homeBranch]! : (o.kind === 'distributor' ? branchIds.NGT! : null),
      decisionReason: o.reason ?? null, decidedAt: o.status === 'pending' ? null : new Date('2026-10-01T09:00:00Z'),
    }
    let org = await Organisation.findOne({ where: { name: o.name, kind: o.kind }, transaction: t })
    if (!org) org = await Organisation.create(values, { transaction: t })
    for (const p of o.people) {
      const existing = await User.findOne({ where: { email: p.email }, transaction: t })
      const user = existing ?? await User.create({ organisationId: org.id, email: p.email, name: p.name, role: p.role, passwordHash: hash, status: 'active' }, { transaction: t })
      const secret = DEMO_TOTP_SECRETS[p.email]
      if (secret) enrolled += await enrolDemoPerson(t, user.id, secret, log)
    }
  }
  log(`accounts: ${branches.length} branches, ${tiers.length} tiers, ${DEMO_ORGS.length} organisations, two-step sign-in set up for ${enrolled} new`)
}

/**
 * Sets up a demo person's authenticator secret unless they have one (a person who set up their own app keeps it).
 * Sealing needs the server's key (NUXT_MFA_KEY or NUXT_SESSION_PASSWORD): without it they set one up at first
 * sign-in instead.
 */
async function enrolDemoPerson(t: Transaction, userId: number, secret: string, log: (s: string) => void): Promise<number> {
  if (await SecondFactor.findOne({ where: { userId }, transaction: t })) return 0
  let sealed: string
  try {
    sealed = sealSecret(secret)
  } catch {
    log('accounts: no NUXT_MFA_KEY or NUXT_SESSION_PASSWORD set, so distributor staff set up two-step sign-in at their first sign-in')
    return 0
  }
  await SecondFactor.create({ userId, secret: sealed, enrolledAt: new Date() }, { transaction: t })
  return 1
}

/** The sign-ins printed by `npm run demo` and listed in the README. */
export function demoSignIns(): { email: string; role: Role; organisation: string; status: OrgStatus }[] {
  return DEMO_ORGS.flatMap((o) => o.people.map((p) => ({ email: p.email, role: p.role, organisation: o.name, status: o.status })))
}

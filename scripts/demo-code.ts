/**
 * npm run demo:code -- <e-mail>: the current two-step sign-in code of a demo distributor account, for trying the demo
 * without an authenticator app (the demo's secrets are invented and printed by `npm run demo`). Not for real accounts:
 * their secrets are sealed in the database and never printed.
 */
import { DEMO_TOTP_SECRETS } from '../server/seed/accounts'
import { TOTP_PERIOD, codeAt } from '../server/services/totp'

const email = (process.argv[2] ?? '').trim().toLowerCase()
const secret = DEMO_TOTP_SECRETS[email]
if (!secret) {
  console.error(`demo:code: ${email ? `${email} is not a demo distributor account` : 'give a demo e-mail'}. Demo accounts with two-step sign-in:`)
  for (const e of Object.keys(DEMO_TOTP_SECRETS)) console.error(`  ${e}`)
  process.exit(1)
}
const now = Math.floor(Date.now() / 1000)
const left = TOTP_PERIOD - (now % TOTP_PERIOD)
console.log(await codeAt(secret, now))
console.error(`(valid for ${left} more second${left === 1 ? '' : 's'}; each code works once)`)

/** npm run fakes: every local stand-in for a hosted service, in one process (Ctrl-C stops them). */
import { existsSync } from 'node:fs'
import { fileURLToPath } from 'node:url'

await import('./mail/index')
if (existsSync(fileURLToPath(new URL('./payments/index.ts', import.meta.url)))) await import('./payments/index')

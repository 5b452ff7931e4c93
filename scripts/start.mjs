// npm start: the built production server, started the way scripts/server-process.mjs says.
import { spawn } from 'node:child_process'
import { serverEnv, serverNodeArgs } from './server-process.mjs'

const child = spawn(process.execPath, [...serverNodeArgs(), '.output/server/index.mjs'], { stdio: 'inherit', env: serverEnv() })
for (const s of ['SIGINT', 'SIGTERM']) process.on(s, () => child.kill(s))
child.on('exit', (code) => process.exit(code ?? 0))

// npm start: the built production server with a libuv pool large enough that parallel password hashing
// (scrypt N=2^17) does not stall database queries (measured: 4 threads stalled them ~2 s).
import { spawn } from 'node:child_process'

const child = spawn(process.execPath, ['.output/server/index.mjs'], {
  stdio: 'inherit',
  env: { NODE_ENV: 'production', UV_THREADPOOL_SIZE: '16', ...process.env },
})
for (const s of ['SIGINT', 'SIGTERM']) process.on(s, () => child.kill(s))
child.on('exit', (code) => process.exit(code ?? 0))

// How the built server process is started, in one place: `npm start`, `npm run demo`, the tests' server and the
// benchmarks all use it, so what the benchmarks measure is what runs.
//
// - UV_THREADPOOL_SIZE=16: parallel password hashing (scrypt N=2^17) otherwise stalls database queries (measured:
//   4 threads stalled them ~2 s);
// - --max-old-space-size: V8 sizes the heap from the machine's memory (about 4 GB here) and, with that much room,
//   lets garbage from busy request handling pile up in the old space (measured in bench/catalogue.ts: resident
//   memory 1,060 MB at 7,800 req/s). With a limit it collects sooner and the load even runs faster (peak 620 MB at
//   11,900 req/s). 1,536 MB leaves room for a catalogue several times the synthetic one (live heap ~300 MB with
//   200k parts); BORELINE_HEAP_MB overrides it.

/** Node options for the server process. */
export function serverNodeArgs(env = process.env) {
  const mb = Number(env.BORELINE_HEAP_MB) || 1536
  return [`--max-old-space-size=${mb}`]
}

/** The environment the server process needs on top of `env`. */
export function serverEnv(env = process.env) {
  return { NODE_ENV: 'production', UV_THREADPOOL_SIZE: '16', ...env }
}

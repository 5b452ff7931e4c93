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
// - --max-semi-space-size=64: every request's short-lived objects are collected in the young generation; at V8's
//   default (16 MB) the vehicle-parts load (bench/catalogue.ts, 50 connections) ran ~4.7 young collections per 1,000
//   answers, each a 10-20 ms pause for every request in flight, and promoted enough to force a full collection every
//   few seconds. At 64 MB: ~1.1 per 1,000 answers, GC time per answer a quarter, for ~50-100 MB more resident memory;
//   BORELINE_SEMI_SPACE_MB overrides it (0: V8's default).

/** Node options for the server process. */
export function serverNodeArgs(env = process.env) {
  const mb = Number(env.BORELINE_HEAP_MB) || 1536
  const semi = env.BORELINE_SEMI_SPACE_MB === undefined ? 64 : Number(env.BORELINE_SEMI_SPACE_MB)
  return [`--max-old-space-size=${mb}`, ...(semi > 0 ? [`--max-semi-space-size=${semi}`] : [])]
}

/** The environment the server process needs on top of `env`. */
export function serverEnv(env = process.env) {
  return { NODE_ENV: 'production', UV_THREADPOOL_SIZE: '16', ...env }
}

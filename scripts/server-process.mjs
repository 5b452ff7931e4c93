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
// - --heap-growing-percent=30: after each full collection V8 lets the old space grow to a multiple of what survived
//   before it collects again (its own choice, from collection and allocation speeds; larger for larger heap limits).
//   At a million parts about 500 MB survive (the search index), so under the vehicle-parts load the process climbed
//   ~250-280 MB between full collections, and that sawtooth made the peak (bench/catalogue.ts: 1,448 MB, against
//   1.2 GB). Growing by 30 % at most keeps it to ~70 MB there (peak 1,066 MB): full collections come more often, each
//   costing about the same (marking what lives), and the vehicle-parts p99 stayed 27 ms; BORELINE_HEAP_GROWING_PERCENT
//   overrides it (0: V8's own factor).

/** Node options for the server process. */
export function serverNodeArgs(env = process.env) {
  const mb = Number(env.BORELINE_HEAP_MB) || 1536
  const semi = env.BORELINE_SEMI_SPACE_MB === undefined ? 64 : Number(env.BORELINE_SEMI_SPACE_MB)
  const growing = env.BORELINE_HEAP_GROWING_PERCENT === undefined ? 30 : Number(env.BORELINE_HEAP_GROWING_PERCENT)
  return [
    `--max-old-space-size=${mb}`,
    ...(semi > 0 ? [`--max-semi-space-size=${semi}`] : []),
    ...(growing > 0 ? [`--heap-growing-percent=${growing}`] : []),
  ]
}

/** The environment the server process needs on top of `env`. */
export function serverEnv(env = process.env) {
  return { NODE_ENV: 'production', UV_THREADPOOL_SIZE: '16', ...env }
}

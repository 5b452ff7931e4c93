/**
 * npm run catalogue:synthetic -- --parts 200000 --vehicles 20000 --fitments 1000000 [--database <sqlite url, path or postgres url>] [--seed 7]
 *
 * Writes a large invented catalogue into a database for benchmarks: vehicles with OE brakes and option questions,
 * parts of every type with valid specs (numbered in sequence: seven digits and a check digit), OE numbers,
 * supersessions, fitment (some with qualifiers), stock in every branch and prices in the active price version. The
 * database is migrated first; when it has no people yet the demo seed runs too (so the benchmark can sign in). Rows
 * go in with raw multi-row INSERTs in a few big transactions, with the revision triggers off during the load (on
 * PostgreSQL they stay on: they fire once per statement, not per row). Deterministic for a given --seed. Refuses a
 * database that already holds synthetic rows (SKUs starting "SY-").
 * PostgreSQL (`--database postgres://…`): the same rows, booleans as true/false, the identity counters of vehicles
 * and parts moved past the ids written here.
 */
import { resolve } from 'node:path'
import { MC_BORES, WC_BORES, prng } from '../server/seed/catalogue-data'
import { openBulk } from './lib/bulk'
import { checkDigit } from './lib/check-digit'
import { esc } from './lib/sqlite-bulk'

interface Args { parts: number; vehicles: number; fitments: number; database: string; seed: number }

function parseArgs(argv: string[]): Args {
  const out: Args = { parts: 200_000, vehicles: 20_000, fitments: 1_000_000, database: process.env.DATABASE_URL || '', seed: 7 }
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!
    const v = argv[i + 1]
    const num = (name: string) => {
      const n = Number(v)
      if (!Number.isInteger(n) || n < 1) throw new Error(`${name} needs a whole number above 0 (got "${v ?? ''}")`)
      i++
      return n
    }
    if (a === '--parts') out.parts = num('--parts')
    else if (a === '--vehicles') out.vehicles = num('--vehicles')
    else if (a === '--fitments') out.fitments = num('--fitments')
    else if (a === '--seed') out.seed = num('--seed')
    else if (a === '--database') { if (!v) throw new Error('--database needs a sqlite URL, a path or a postgres URL'); out.database = v; i++ }
    else throw new Error(`Unknown option ${a}. Use --parts N --vehicles N --fitments N [--database <url|path>] [--seed N]`)
  }
  if (!out.database) throw new Error('Give --database <sqlite:./file.sqlite or path> or set DATABASE_URL')
  if (!out.database.startsWith('sqlite:') && !out.database.startsWith('postgres')) out.database = `sqlite:${resolve(out.database)}`
  return out
}

const SYL = ['dor', 'vel', 'mar', 'tis', 'qua', 'len', 'bro', 'zan', 'fel', 'ryn', 'osk', 'tav', 'pel', 'gri', 'hul', 'ves', 'nor', 'cal', 'mib', 'sot', 'ark', 'lun', 'det', 'rov']
const ENDS = ['ex', 'ora', 'and', 'ik', 'une', 'ast', 'ello', 'ium']
const cap = (s: string) => s[0]!.toUpperCase() + s.slice(1)
const LINE_WORDS = ['Quarrystone', 'Fellgate', 'Ironmere', 'Saltash', 'Brackwater', 'Copperleaf', 'Dunmore', 'Harrowfield', 'Kestlow', 'Marshend',
  'Northwick', 'Oakhurst', 'Pitchford', 'Redstreak', 'Stonebank', 'Tidemark', 'Underhill', 'Westmarch', 'Yarrowby', 'Ashgrove']
const LINE_KINDS = ['Standard', 'Coated', 'Sport', 'Fleet', 'Ceramic', 'Street', 'Heavy Duty', 'Reman', 'Pro', 'Eco']
const FEATURES = ['low dust', 'quiet shim', 'chamfered', 'slotted', 'drilled', 'anti-corrosion coating', 'OE quality', 'bedded', 'fleet grade', 'high temperature']

const TYPE_SHARE: [string, number][] = [
  ['pad_set', 0.22], ['disc', 0.2], ['caliper', 0.17], ['hose', 0.08], ['fitting_kit', 0.06], ['wear_sensor', 0.04],
  ['master_cylinder', 0.05], ['wheel_cylinder', 0.04], ['drum', 0.05], ['shoe_set', 0.05], ['fluid', 0.04],
]
const SKU_PREFIX: Record<string, string> = {
  disc: 'SY-D', pad_set: 'SY-P', caliper: 'SY-C', drum: 'SY-R', shoe_set: 'SY-S', wheel_cylinder: 'SY-W', hose: 'SY-H',
  fitting_kit: 'SY-K', wear_sensor: 'SY-E', master_cylinder: 'SY-M', fluid: 'SY-F',
}
const DISC_D = [240, 256, 262, 266, 276, 280, 288, 294, 300, 312, 320, 330, 340, 345, 350, 360, 380]

async function main() {
  const args = parseArgs(process.argv.slice(2))
  process.env.DATABASE_URL = args.database
  const t0 = Date.now()
  const { getDb, closeDb, storageFromUrl } = await import('../server/utils/db')
  const { migrateUp } = await import('../server/utils/migrate')
  const { initModels } = await import('../server/models/index')
  const { CATALOGUE_TABLES } = await import('../server/migrations/0004-catalogue-extra')
  // the part-search change log too: a saved index notices a bulk load by the part count and highest id instead
  const { PART_SEARCH_SOURCES } = await import('../server/migrations/0023-part-search-changes')
  await migrateUp(getDb())
  initModels(getDb())
  const [users] = await getDb().query('SELECT COUNT(*) AS n FROM users') as [{ n: number }[], unknown]
  if (!users[0]!.n) {
    const { runSeed } = await import('../server/seed/index')
    await runSeed((s) => console.log(`seed ${s}`))
  }
  await closeDb()

  const db = await openBulk(args.database, () => storageFromUrl(args.database))
  if (!db.postgres) await db.run('PRAGMA journal_mode=WAL; PRAGMA synchronous=OFF; PRAGMA cache_size=-200000; PRAGMA temp_store=MEMORY; PRAGMA foreign_keys=OFF')
  const [existing] = await db.all<{ n: number }>("SELECT COUNT(*) AS n FROM parts WHERE sku LIKE 'SY-%'")
  if (Number(existing!.n) > 0) throw new Error(`This database already holds ${existing!.n} synthetic parts. Use a fresh database.`)
  const branches = await db.all<{ id: number }>('SELECT id FROM branches ORDER BY id')
  let [list] = await db.all<{ id: number }>("SELECT id FROM price_versions WHERE status = 'active' ORDER BY version DESC LIMIT 1")
  if (!list) {
    await db.run(`INSERT INTO price_versions (version, label, status, effective_at, activated_at, created_at, updated_at) VALUES ((SELECT COALESCE(MAX(version), 0) + 1 FROM price_versions), 'Synthetic', 'active', CURRENT_TIMESTAMP, CURRENT_TIMESTAMP, CURRENT_TIMESTAMP, CURRENT_TIMESTAMP)`)
    ;[list] = await db.all<{ id: number }>("SELECT id FROM price_versions WHERE status = 'active' ORDER BY version DESC LIMIT 1")
  }
  const triggers = [...CATALOGUE_TABLES, 'stock_levels'].flatMap((t) => ['insert', 'update', 'delete'].map((op) => `${t}_rev_${op}`))
    .concat(PART_SEARCH_SOURCES.flatMap(({ table }) => ['insert', 'update', 'delete'].map((op) => `${table}_search_${op}`)))
  // SQLite's triggers fire once per row: off for the load, put back after it
  const triggerSql = db.postgres ? [] : await db.all<{ sql: string }>(`SELECT sql FROM sqlite_master WHERE type = 'trigger' AND name IN (${triggers.map(esc).join(',')})`)
  if (!db.postgres) for (const name of triggers) await db.run(`DROP TRIGGER IF EXISTS ${name}`)

  const r = prng(args.seed)
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)]!
  const between = (lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1))
  const digits = (n: number) => { let s = ''; for (let i = 0; i < n; i++) s += Math.floor(r() * 10); return s }
  const now = new Date().toISOString().replace('T', ' ').replace('Z', ' +00:00')

  // ---- vehicles
  const makes = Array.from({ length: 60 }, (_, i) => cap(SYL[i % SYL.length]! + SYL[(i * 7 + 3) % SYL.length]! + ENDS[i % ENDS.length]!))
  const models = makes.map((_, mi) => Array.from({ length: 12 }, (_, j) => cap(SYL[(mi + j * 5) % SYL.length]! + ENDS[(mi + j) % ENDS.length]!) + (j >= 8 ? ` ${j}` : '')))
  const [maxV] = await db.all<{ id: number | null }>('SELECT MAX(id) AS id FROM vehicles')
  const firstVehicleId = (maxV!.id ?? 0) + 1
  interface V { id: number; make: string; model: string; hasOption: boolean; discs: number[]; mc: number; piston: number; wc: number; rearDrum: boolean }
  const vehicles: V[] = []
  const vehicleRows: unknown[][] = []
  const optionRows: unknown[][] = []
  const brakeRows: unknown[][] = []
  for (let i = 0; i < args.vehicles; i++) {
    const mi = i % makes.length
    const make = makes[mi]!
    const model = pick(models[mi]!)
    const id = firstVehicleId + i
    const d = pick(DISC_D)
    const hasOption = r() < 0.3
    const discs = hasOption ? [d, Math.min(d + 20, 380)] : [d]
    const mc = pick(MC_BORES), piston = pick([38, 42, 45, 48, 51, 54, 57, 60]), wc = pick(WC_BORES)
    const rearDrum = r() < 0.25
    const yearFrom = between(2004, 2022)
    vehicles.push({ id, make, model, hasOption, discs, mc, piston, wc, rearDrum })
    vehicleRows.push([id, make, model, `Gen ${between(1, 6)}`, pick(['hatchback', 'saloon', 'estate', 'SUV', 'van']), yearFrom, r() < 0.4 ? null : yearFrom + between(3, 8),
      `${make.slice(0, 2).toUpperCase()}-${digits(3)}`, pick([999, 1199, 1395, 1598, 1968, 1995, 2179]), pick(['petrol', 'diesel', 'hybrid', 'electric']), between(50, 250),
      pick(['FWD', 'RWD', 'AWD']), pick(['diagonal', 'front-rear']), pick(['DOT 4', 'DOT 5.1']), pick(['195/55 R16', '205/55 R16', '225/45 R17', '235/55 R19']),
      between(950, 2300), mc, true, pick([32, 34, 36]), pick([3.4, 3.8, 4.2]), pick([4.5, 5.5, 6.5]), 'cable', now, now])
    if (hasOption) {
      optionRows.push([id, 'front_disc_diameter_mm', 'Front disc diameter', `Front disc diameter: ${discs[0]} mm or ${discs[1]} mm? Measure the disc.`, JSON.stringify(discs.map((x) => ({ value: String(x), label: `${x} mm` }))), now, now])
    }
    for (const dd of discs) {
      brakeRows.push([id, 'front', hasOption ? JSON.stringify({ front_disc_diameter_mm: String(dd) }) : '{}', 'disc', dd, 25, 23, true, null, null, 'floating', JSON.stringify([piston]), null, 0.05, 0.015, now, now])
    }
    if (rearDrum) brakeRows.push([id, 'rear', '{}', 'drum', null, null, null, null, 228.6, 230.1, null, null, wc, 0.1, null, now, now])
    else brakeRows.push([id, 'rear', '{}', 'disc', 272, 10, 9, false, null, null, 'floating', JSON.stringify([38]), null, 0.08, 0.02, now, now])
  }
  await db.insertAll('vehicles', ['id', 'make', 'model', 'generation', 'body', 'year_from', 'year_to', 'engine_code', 'engine_cc', 'fuel', 'power_kw', 'drive', 'circuit_split',
    'fluid_grade', 'tyre_size', 'kerb_mass_kg', 'mc_bore_mm', 'mc_tandem', 'mc_stroke_mm', 'pedal_ratio', 'booster_ratio', 'parking_brake', 'created_at', 'updated_at'], vehicleRows)
  await db.insertAll('vehicle_options', ['vehicle_id', 'key', 'label', 'question', '"values"', 'created_at', 'updated_at'], optionRows)
  await db.insertAll('vehicle_brakes', ['vehicle_id', 'axle', 'qualifiers', 'kind', 'disc_diameter_mm', 'disc_thickness_mm', 'disc_min_thickness_mm', 'disc_vented',
    'drum_diameter_mm', 'drum_max_diameter_mm', 'caliper_type', 'piston_diameters_mm', 'wheel_cylinder_bore_mm', 'max_runout_mm', 'max_thickness_variation_mm', 'created_at', 'updated_at'], brakeRows)
  console.log(`vehicles: ${vehicles.length} (${optionRows.length} with an option question) in ${((Date.now() - t0) / 1000).toFixed(1)} s`)

  // ---- parts
  const [maxP] = await db.all<{ id: number | null }>('SELECT MAX(id) AS id FROM parts')
  const firstPartId = (maxP!.id ?? 0) + 1
  const pools: Record<string, number[]> = {}
  const partRows: unknown[][] = []
  const oeRows: unknown[][] = []
  const priceRows: unknown[][] = []
  const stockRows: unknown[][] = []
  const supRows: unknown[][] = []
  const partAxle = new Map<number, string>()
  const lines = LINE_WORDS.flatMap((w) => LINE_KINDS.map((k) => `${w} ${k}`))
  let pid = firstPartId
  for (const [type, share] of TYPE_SHARE) {
    const n = Math.max(1, Math.round(args.parts * share))
    pools[type] = []
    for (let k = 0; k < n && pid < firstPartId + args.parts; k++) {
      const id = pid++
      const axle = r() < 0.6 ? 'front' : 'rear'
      const line = pick(lines)
      const mk = pick(makes), md = pick(models[makes.indexOf(mk)]!)
      const feat = pick(FEATURES)
      let specs: Record<string, unknown>, desc: string, core = 0
      switch (type) {
        case 'disc': { const d = pick(DISC_D), t = pick([10, 12, 22, 25, 28, 30, 32]), vented = t >= 20; specs = { axle, diameterMm: d, thicknessMm: t, minThicknessMm: t - (vented ? 2 : 1), heightMm: pick([38, 40.5, 44, 46.5]), centreBoreMm: pick([57.1, 63.4, 67.1, 72.6]), boltHoles: pick([4, 5]), pcdMm: pick([100, 108, 112, 114.3, 120]), vented }; desc = `${cap(axle)} brake disc ${d} × ${t} mm ${vented ? 'vented' : 'solid'}, ${feat}, ${line}, for ${mk} ${md}`; break }
        case 'pad_set': { const w = between(90, 170), h = between(40, 72), t = pick([15, 16.5, 17.5, 19, 20]); specs = { axle, padShape: `PS-${digits(5)}`, widthMm: w, heightMm: h, thicknessMm: t, wearSensor: pick(['none', 'integrated', 'separate']), frictionCode: pick(['FF', 'FG', 'GG', 'EF']) }; desc = `${cap(axle)} pad set ${w} × ${h} × ${t} mm, ${feat}, ${line}, for ${mk} ${md}`; break }
        case 'caliper': { const p = pick([36, 38, 40, 42, 45, 48, 51, 54, 57, 60]), reman = r() < 0.4; core = reman ? between(20, 45) * 100 : 0; const side = pick(['left', 'right']); specs = { position: `${axle}-${side}`, caliperType: 'floating', pistonCount: 1, pistonDiametersMm: [p], padShape: `PS-${digits(5)}`, parkingBrake: axle === 'rear' ? pick(['cable', 'electric']) : 'none', condition: reman ? 'remanufactured' : 'new', coreDepositApplies: reman }; desc = `Brake caliper ${axle} ${side}, floating ${p} mm, ${reman ? 'remanufactured (exchange)' : 'new'}, ${line}, for ${mk} ${md}`; break }
        case 'hose': { const l = between(20, 60) * 10; specs = { position: `${axle}-${pick(['left', 'right'])}`, lengthMm: l, threadA: 'M10x1.0 male', threadB: pick(['M10x1.0 female', '3/8-24 UNF female']) }; desc = `Brake hose ${axle} ${l} mm, ${line}, for ${mk} ${md}`; break }
        case 'fitting_kit': specs = { axle, kitFor: 'pad_set', padShape: `PS-${digits(5)}`, pieces: between(4, 20) }; desc = `${cap(axle)} pad fitting kit, ${line}, for ${mk} ${md}`; break
        case 'wear_sensor': { const l = between(10, 24) * 50; specs = { axle, lengthMm: l, connector: `${mk.slice(0, 3).toUpperCase()} 2-pin` }; desc = `${cap(axle)} wear sensor ${l} mm, ${line}, for ${mk} ${md}`; break }
        case 'master_cylinder': { const b = pick(MC_BORES), reman = r() < 0.4; core = reman ? between(25, 40) * 100 : 0; specs = { boreMm: b, tandem: true, ports: pick([2, 4]), reservoir: pick(['integrated', 'remote']), condition: reman ? 'remanufactured' : 'new', coreDepositApplies: reman }; desc = `Master cylinder tandem ${b} mm bore, ${reman ? 'remanufactured (exchange)' : 'new'}, ${line}, for ${mk} ${md}`; break }
        case 'wheel_cylinder': { const b = pick(WC_BORES); specs = { axle: 'rear', boreMm: b, side: 'pair' }; desc = `Rear wheel cylinder ${b} mm bore, ${line}, for ${mk} ${md}`; break }
        case 'drum': { const d = pick([180, 203, 228.6, 254, 280]); specs = { axle: 'rear', diameterMm: d, maxDiameterMm: d + 2, widthMm: pick([38, 42, 57]), boltHoles: pick([4, 5]) }; desc = `Rear brake drum ${d} mm, ${line}, for ${mk} ${md}`; break }
        case 'shoe_set': { const d = pick([180, 203, 228.6, 254, 280]); specs = { axle: 'rear', diameterMm: d, widthMm: pick([38, 42, 57]), frictionCode: pick(['EE', 'FF']), parkingLever: true }; desc = `Rear brake shoe set ${d} mm, ${line}, for ${mk} ${md}`; break }
        default: { const ml = pick([500, 1000, 5000]), g = pick(['DOT 3', 'DOT 4', 'DOT 5.1']); specs = { grade: g, volumeMl: ml }; desc = `Brake fluid ${g}, ${ml} ml, ${line}` }
      }
      // the national range's numbers: in sequence, with a check digit, so a slip never makes another part's number
      const body = String(id).padStart(7, '0')
      const sku = `${SKU_PREFIX[type]}${body}${checkDigit(body)}`
      partAxle.set(id, type === 'master_cylinder' || type === 'fluid' ? 'all' : String((specs.axle as string | undefined) ?? (specs.position as string).split('-')[0]))
      partRows.push([id, sku, type, line, desc, JSON.stringify(specs), r() < 0.02 ? 'discontinued' : 'active', now, now])
      pools[type]!.push(id)
      const oeCount = type === 'fluid' ? 0 : between(1, 2)
      for (let o = 0; o < oeCount; o++) {
        const prefix = pick(['VX', 'QT', 'MR', 'LN', 'BK', 'ZD'])
        const oe = `${prefix}${digits(3)} ${digits(3)} ${digits(2)}`
        oeRows.push([id, oe, oe.replace(/[^A-Z0-9]/gi, '').toUpperCase(), mk])
      }
      const list = between(600, 16_000) * 5
      priceRows.push([list_id(), id, list, Math.round(list * 0.6), core, 1])
      for (const b of branches) stockRows.push([id, b.id, r() < 0.2 ? 0 : between(1, 30), now])
      if (r() < 0.02) supRows.push([`SY-OLD-${String(id).padStart(7, '0')}`, id, `Replaced by ${sku}: revised part.`, now])
    }
  }
  function list_id() { return list!.id }
  await db.insertAll('parts', ['id', 'sku', 'type', 'product_line', 'description', 'specs', 'status', 'created_at', 'updated_at'], partRows, 500)
  await db.insertAll('part_oe_numbers', ['part_id', 'oe_number', 'oe_normalised', 'maker'], oeRows)
  await db.insertAll('part_prices', ['price_version_id', 'part_id', 'list_price_minor', 'trade_cost_minor', 'core_deposit_minor', 'pack_quantity'], priceRows)
  await db.insertAll('stock_levels', ['part_id', 'branch_id', 'quantity', 'updated_at'], stockRows)
  await db.insertAll('supersessions', ['old_sku', 'new_part_id', 'note', 'created_at'], supRows)
  console.log(`parts: ${partRows.length}, OE numbers: ${oeRows.length}, supersessions: ${supRows.length} in ${((Date.now() - t0) / 1000).toFixed(1)} s`)

  // ---- fitments: an even share per vehicle, typed like a real vehicle's list
  const perVehicle = Math.max(1, Math.floor(args.fitments / vehicles.length))
  let extra = args.fitments - perVehicle * vehicles.length
  const typeWeights = TYPE_SHARE.filter(([t]) => pools[t]!.length)
  function* fitmentRows(): Generator<unknown[]> {
    for (const v of vehicles) {
      const n = perVehicle + (extra-- > 0 ? 1 : 0)
      for (let k = 0; k < n; k++) {
        let x = r(), type = typeWeights[0]![0]
        for (const [t, w] of typeWeights) { if ((x -= w) <= 0) { type = t; break } }
        const pool = pools[type]!
        const partId = pool[Math.floor(r() * pool.length)]!
        const axle = partAxle.get(partId)!
        const side = type === 'caliper' || type === 'hose' ? pick(['left', 'right']) : 'pair'
        const qualifiers = v.hasOption && axle === 'front' && (type === 'disc' || type === 'pad_set' || type === 'caliper') ? JSON.stringify({ front_disc_diameter_mm: String(pick(v.discs)) }) : '{}'
        yield [v.id, partId, axle, side, type === 'disc' || type === 'drum' ? 2 : 1, qualifiers, '', now, now]
      }
    }
  }
  const nf = await db.insertAll('fitments', ['vehicle_id', 'part_id', 'axle', 'side', 'quantity', 'qualifiers', 'note', 'created_at', 'updated_at'], fitmentRows(), 2000)
  console.log(`fitments: ${nf} in ${((Date.now() - t0) / 1000).toFixed(1)} s`)

  for (const t of triggerSql) await db.run(t.sql)
  await db.run('UPDATE catalogue_revisions SET catalogue = catalogue + 1, stock = stock + 1 WHERE id = 1')
  if (db.postgres) {
    // the ids written above were given, not drawn: the next row the app adds must come after them
    for (const table of ['vehicles', 'parts']) await db.run(`SELECT setval(pg_get_serial_sequence('${table}', 'id'), (SELECT MAX(id) FROM ${table}))`)
    await db.run('ANALYZE')
  } else {
    await db.run('PRAGMA synchronous=NORMAL; ANALYZE; PRAGMA wal_checkpoint(TRUNCATE)')
  }
  await db.close()
  console.log(`done in ${((Date.now() - t0) / 1000).toFixed(1)} s: ${args.database}`)
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
})

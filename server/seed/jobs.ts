/**
 * The demo's workshop data, made from the catalogue already seeded: per vehicle its workshop figures (fluid
 * capacity, torques) and the labour guide's hours (invented, scaled by the car's mass and brakes), and the
 * catalogue's part relations (a pad set's fitting kit and wear sensor, a disc's pads, shoes with wheel cylinders,
 * hydraulic parts with fluid by the vehicle's capacity). Idempotent: skipped when the labour guide has rows.
 */
import { Op, type Transaction } from 'sequelize'
import { Fitment, Part, Vehicle, VehicleBrake } from '../models/catalogue'
import { LabourTime, PartRelation, VehicleJobData } from '../models/jobs'
import type { LabourOperation } from '../../shared/utils/jobs/labour'
import type { PartRelationKind } from '../../shared/utils/jobs/relations'

/** Guide hours (hundredths) for a mid-size car; heavier cars take longer (seized fixings, bigger parts). */
const BASE: Record<LabourOperation, number> = {
  front_pads: 80, front_discs_pads: 130, rear_pads: 90, rear_discs_pads: 140, rear_shoes: 120, rear_drums_shoes: 150,
  front_caliper: 90, rear_caliper: 100, front_hose: 60, rear_hose: 70, wheel_cylinder: 80, master_cylinder: 120, fluid_flush: 60,
}
const REAR_DISC: LabourOperation[] = ['rear_pads', 'rear_discs_pads', 'rear_caliper']
const REAR_DRUM: LabourOperation[] = ['rear_shoes', 'rear_drums_shoes', 'wheel_cylinder']

function torquesFor(massKg: number) {
  const heavy = massKg >= 1700
  return [
    { what: 'Front caliper carrier bolts', nm: heavy ? 190 : massKg >= 1300 ? 150 : 110 },
    { what: 'Front caliper guide bolts', nm: heavy ? 35 : 28 },
    { what: 'Rear caliper carrier bolts', nm: heavy ? 110 : 80 },
    { what: 'Brake hose banjo bolts', nm: 18 },
    { what: 'Bleed nipples', nm: 9 },
    { what: 'Wheel nuts or bolts', nm: heavy ? 140 : 120 },
  ]
}

export async function seedJobs(t: Transaction, log: (s: string) => void): Promise<void> {
  const opts = { transaction: t }
  if (await LabourTime.count(opts)) return
  const vehicles = await Vehicle.findAll({ attributes: ['id', 'kerbMassKg'], ...opts })
  const brakes = await VehicleBrake.findAll({ attributes: ['vehicleId', 'axle', 'kind'], ...opts })
  const times: { vehicleId: number; operation: string; hoursHundredths: number }[] = []
  const data: { vehicleId: number; fluidCapacityMl: number; torques: ReturnType<typeof torquesFor> }[] = []
  for (const v of vehicles) {
    const mass = v.kerbMassKg ?? 1400
    const scale = mass >= 1900 ? 1.3 : mass >= 1500 ? 1.1 : 1
    const rear = new Set(brakes.filter((b) => b.vehicleId === v.id && b.axle === 'rear').map((b) => b.kind))
    for (const [op, h] of Object.entries(BASE) as [LabourOperation, number][]) {
      if (REAR_DISC.includes(op) && !rear.has('disc')) continue
      if (REAR_DRUM.includes(op) && !rear.has('drum')) continue
      times.push({ vehicleId: v.id, operation: op, hoursHundredths: Math.round((h * scale) / 5) * 5 })
    }
    data.push({ vehicleId: v.id, fluidCapacityMl: mass >= 1900 ? 1100 : mass >= 1500 ? 900 : 700, torques: torquesFor(mass) })
  }
  await LabourTime.bulkCreate(times, opts)
  await VehicleJobData.bulkCreate(data, opts)

  // relations from what fits the same vehicle on the same axle
  const parts = new Map((await Part.findAll({ attributes: ['id', 'type', 'specs', 'status'], ...opts })).map((p) => [p.id, p]))
  const live = (await Fitment.findAll({ attributes: ['vehicleId', 'partId', 'axle'], ...opts }))
    .filter((f) => parts.get(f.partId)?.status === 'active').map((f) => ({ vehicleId: f.vehicleId, partId: f.partId, axle: f.axle, part: parts.get(f.partId) }))
  const onAxle = (vehicleId: number, axle: string, type: string) => live.filter((f) => f.vehicleId === vehicleId && f.axle === axle && f.part!.type === type)
  const relations = new Map<string, { partId: number; relatedPartId: number; relation: PartRelationKind; quantity: number; byFluidVolume: boolean; reason: string }>()
  const relate = (partId: number, relatedPartId: number, relation: PartRelationKind, reason: string, byFluidVolume = false) => {
    const key = `${partId}|${relatedPartId}`
    if (!relations.has(key)) relations.set(key, { partId, relatedPartId, relation, quantity: 1, byFluidVolume, reason })
  }
  const fluidGrades = new Map((await Vehicle.findAll({ attributes: ['id', 'fluidGrade'], ...opts })).map((v) => [v.id, v.fluidGrade]))
  for (const f of live) {
    const type = f.part!.type
    if (type === 'pad_set') {
      for (const k of onAxle(f.vehicleId, f.axle, 'fitting_kit').slice(0, 1)) relate(f.partId, k.partId, 'fitting_kit', 'New clips and guide-pin boots with every pad change.')
      for (const s of onAxle(f.vehicleId, f.axle, 'wear_sensor').slice(0, 1)) relate(f.partId, s.partId, 'wear_sensor', 'A sensor that has touched the disc is worn through: replace it with the pads.')
    }
    if (type === 'disc') for (const p of onAxle(f.vehicleId, f.axle, 'pad_set').slice(0, 1)) relate(f.partId, p.partId, 'pad_set', 'New discs take new pads: old pads are bedded to the old faces.')
    if (type === 'shoe_set') for (const w of onAxle(f.vehicleId, f.axle, 'wheel_cylinder').slice(0, 1)) relate(f.partId, w.partId, 'wheel_cylinder', 'Change the wheel cylinders with the shoes when they weep or the seals are old.')
    if (['caliper', 'hose', 'wheel_cylinder', 'master_cylinder'].includes(type)) {
      const fluid = live.filter((x) => x.vehicleId === f.vehicleId && x.part!.type === 'fluid' && (x.part!.specs as { grade?: string }).grade === fluidGrades.get(f.vehicleId))
        .sort((a, b) => Number((a.part!.specs as { volumeMl?: number }).volumeMl) - Number((b.part!.specs as { volumeMl?: number }).volumeMl))
      for (const x of fluid.slice(0, 1)) relate(f.partId, x.partId, 'fluid', 'Opening the hydraulics means bleeding: fluid by the vehicle\'s capacity.', true)
    }
  }
  const existing = await PartRelation.count({ where: { partId: { [Op.gt]: 0 } }, ...opts })
  if (!existing) await PartRelation.bulkCreate([...relations.values()], opts)
  log(`jobs: ${times.length} labour times, ${data.length} vehicles' workshop figures, ${relations.size} part relations`)
}

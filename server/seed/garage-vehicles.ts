/**
 * Demo register of customers and vehicles (invented people, registrations and VINs), and the WMI table of the
 * catalogue data. Millbrook Motor Works: one car with remembered answers and readings (LM65 WRD, a Kaskel Vell
 * with rear drums and a cable handbrake), and a record for each car its demo quotes are for, the quotes linked to
 * them; Tannery Yard Autos holds one of the same cars under its own record. The registrations and VINs agree with
 * fakes/vehicle-data. Idempotent: a garage that already has vehicles is left as it is.
 */
import { Op, Sequelize, type Transaction } from 'sequelize'
import { Organisation } from '../models/accounts'
import { Vehicle } from '../models/catalogue'
import { GarageCustomer, GarageVehicle, OdometerReading, WmiCode } from '../models/garage-vehicles'
import { Quote } from '../models/quotes'
import { normaliseRegistration } from '../../shared/utils/vehicles/registration'
import { DEMO_WMIS } from './wmi-data'

const DAY = 86_400_000

interface DemoOwner { name: string; email: string; phone: string; consent: boolean }
interface DemoCar {
  registration: string; vin: string; built: string | null
  /** the catalogue vehicle; absent: the one the garage's quote for this registration is for */
  vehicle?: { make: string; model: string; generation: string; engineCode: string }
  answers?: Record<string, string>
  owner: DemoOwner
  readings?: { reading: number; daysAgo: number }[]
  notes?: string
}

const MILLBROOK: DemoCar[] = [
  {
    registration: 'LM65 WRD', vin: 'WK3VB2D18FT104472', built: '2015-09',
    vehicle: { make: 'Kaskel', model: 'Vell', generation: 'V3', engineCode: 'D20' },
    answers: { rear_brake: 'drum', parking_brake: 'cable' },
    owner: { name: 'Bryony Tallis', email: 'bryony.tallis@owners.test', phone: '07700 900 728', consent: true },
    readings: [{ reading: 61_250, daysAgo: 380 }, { reading: 72_904, daysAgo: 20 }],
    notes: 'Tows a caravan in summer: check the rear shoes for heat marks.',
  },
  { registration: 'NG19 KTV', vin: 'SVTPA1P11JN402215', built: '2018-11', owner: { name: 'Ellis Marrow', email: 'ellis.marrow@owners.test', phone: '07700 900 311', consent: false } },
  { registration: 'RV66 LMB', vin: 'SVTPA1P15GN090117', built: null, answers: { front_disc_diameter_mm: '300' }, owner: { name: 'Priti Vance', email: 'priti.vance@owners.test', phone: '07700 900 452', consent: false } },
  { registration: 'NG20 PRW', vin: 'SVTSA2P14LN208815', built: '2020-03', owner: { name: 'Tomasz Reed', email: 'tomasz.reed@owners.test', phone: '07700 900 583', consent: true } },
  { registration: 'NG14 DXA', vin: 'SVTPA1P16EN117340', built: null, owner: { name: 'Odile Farrant', email: 'odile.farrant@owners.test', phone: '', consent: false } },
  { registration: 'NG17 HBE', vin: 'SVTPA1P18HN311906', built: null, owner: { name: 'Sunniva Holt', email: 'sunniva.holt@owners.test', phone: '07700 900 664', consent: false } },
]

const TANNERY: DemoCar[] = [
  {
    registration: 'NG14 DXA', vin: 'SVTPA1P16EN117340', built: null, vehicle: { make: 'Veltra', model: 'Pennon', generation: 'Mk1', engineCode: 'P14T' },
    owner: { name: 'Odile Farrant', email: 'odile.farrant@owners.test', phone: '', consent: false },
  },
]

async function quoteFor(t: Transaction, organisationId: number, registration: string): Promise<Quote | null> {
  return Quote.findOne({
    where: { organisationId, [Op.and]: [Sequelize.where(Sequelize.fn('replace', Sequelize.col('registration'), ' ', ''), registration)] },
    order: [['id', 'ASC']], transaction: t,
  })
}

async function seedGarage(t: Transaction, garage: string, cars: DemoCar[], now: number): Promise<number> {
  const org = await Organisation.findOne({ where: { name: garage, kind: 'garage' }, transaction: t })
  if (!org || await GarageVehicle.count({ where: { organisationId: org.id }, transaction: t })) return 0
  for (const car of cars) {
    const registration = normaliseRegistration(car.registration)
    const quote = await quoteFor(t, org.id, registration)
    // engine codes carry the make's prefix in the catalogue ("KS-D20"): match on the end
    const vehicle = car.vehicle
      ? await Vehicle.findOne({ where: { ...car.vehicle, engineCode: { [Op.like]: `%${car.vehicle.engineCode}` } }, transaction: t })
      : null
    const vehicleId = vehicle?.id ?? quote?.vehicleId ?? null
    const o = car.owner
    const customer = await GarageCustomer.create({
      organisationId: org.id, name: o.name, email: o.email, phone: o.phone, reminderConsent: o.consent,
      consentChangedAt: o.consent ? new Date(now - 400 * DAY) : null, consentSource: o.consent ? 'asked at the counter' : '',
    }, { transaction: t })
    const v = await GarageVehicle.create({
      organisationId: org.id, customerId: customer.id, registration, vin: car.vin, vehicleId, answers: car.answers ?? {}, built: car.built, notes: car.notes ?? '',
    }, { transaction: t })
    for (const r of car.readings ?? []) {
      const at = new Date(now - r.daysAgo * DAY)
      await OdometerReading.create({ garageVehicleId: v.id, reading: r.reading, unit: 'mi', readOn: at.toISOString().slice(0, 10), source: 'recorded', createdAt: at }, { transaction: t })
    }
    if (quote) {
      await Quote.update({ garageVehicleId: v.id }, {
        where: { organisationId: org.id, [Op.and]: [Sequelize.where(Sequelize.fn('replace', Sequelize.col('registration'), ' ', ''), registration)] }, transaction: t,
      })
    }
  }
  return cars.length
}

export async function seedGarageVehicles(t: Transaction, log: (s: string) => void): Promise<void> {
  await WmiCode.bulkCreate(DEMO_WMIS.map((w) => ({ ...w })), { ignoreDuplicates: true, transaction: t })
  const now = Date.now()
  const made = await seedGarage(t, 'Millbrook Motor Works', MILLBROOK, now) + await seedGarage(t, 'Tannery Yard Autos', TANNERY, now)
  log(`garage vehicles: ${DEMO_WMIS.length} WMI codes, ${made} vehicles with their owners${made ? '' : ' (already there)'}`)
}

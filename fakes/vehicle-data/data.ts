/**
 * The invented vehicles the fake knows, by registration (normalised: capitals, no spaces). Makes and models are the
 * demo catalogue's invented ones; registrations follow the UK current format with age identifiers that agree with
 * the first registration month (DVLA INF104), and the VINs carry a correct check digit (49 CFR 565.15(c)) and the
 * model-year letter of their year. None of them is a real vehicle.
 */

export interface FakeVehicle {
  registration: string
  make: string
  model: string
  variant: string
  yearOfManufacture: number
  /** 'YYYY-MM' */
  firstRegistered: string
  engineCapacityCc: number | null
  fuelType: 'PETROL' | 'DIESEL' | 'HYBRID' | 'ELECTRIC'
  colour: string
  vin: string
}

export const FAKE_VEHICLES: readonly FakeVehicle[] = [
  { registration: 'LM65WRD', make: 'KASKEL', model: 'VELL', variant: '2.0 D', yearOfManufacture: 2015, firstRegistered: '2015-11', engineCapacityCc: 1968, fuelType: 'DIESEL', colour: 'GREY', vin: 'WK3VB2D18FT104472' },
  { registration: 'NG20PRW', make: 'VELTRA', model: 'SKERRY', variant: '2.0 T', yearOfManufacture: 2020, firstRegistered: '2020-05', engineCapacityCc: 1984, fuelType: 'PETROL', colour: 'BLUE', vin: 'SVTSA2P14LN208815' },
  { registration: 'NG17HBE', make: 'VELTRA', model: 'PENNON', variant: '1.4 T', yearOfManufacture: 2017, firstRegistered: '2017-04', engineCapacityCc: 1395, fuelType: 'PETROL', colour: 'RED', vin: 'SVTPA1P18HN311906' },
  { registration: 'NG14DXA', make: 'VELTRA', model: 'PENNON', variant: '1.4 T', yearOfManufacture: 2014, firstRegistered: '2014-06', engineCapacityCc: 1395, fuelType: 'PETROL', colour: 'WHITE', vin: 'SVTPA1P16EN117340' },
  { registration: 'NG19KTV', make: 'VELTRA', model: 'PENNON', variant: '1.4 T', yearOfManufacture: 2018, firstRegistered: '2019-03', engineCapacityCc: 1395, fuelType: 'PETROL', colour: 'SILVER', vin: 'SVTPA1P11JN402215' },
  { registration: 'RV66LMB', make: 'VELTRA', model: 'PENNON', variant: '1.4 T', yearOfManufacture: 2016, firstRegistered: '2016-09', engineCapacityCc: 1395, fuelType: 'PETROL', colour: 'BLACK', vin: 'SVTPA1P15GN090117' },
  { registration: 'YT68KDM', make: 'DURMOND', model: 'CADDOW', variant: '1.2', yearOfManufacture: 2018, firstRegistered: '2018-10', engineCapacityCc: 1199, fuelType: 'PETROL', colour: 'YELLOW', vin: 'VD7CA3P11JC551028' },
  { registration: 'WF21KNE', make: 'QUILLAN', model: 'DRAY', variant: '2.0 D', yearOfManufacture: 2021, firstRegistered: '2021-04', engineCapacityCc: 1997, fuelType: 'DIESEL', colour: 'WHITE', vin: 'VQ2DR2D27MA014386' },
  { registration: 'BX70LRT', make: 'BRENMOOR', model: 'HALYARD', variant: '2.0 D', yearOfManufacture: 2020, firstRegistered: '2020-09', engineCapacityCc: 1995, fuelType: 'DIESEL', colour: 'GREEN', vin: 'SBRHA5D23LB660391' },
]

/**
 * Model registry. `initModels()` binds every model to the one Sequelize instance; the database plugin calls
 * it at start and scripts call it before use. Each domain keeps its models in its own file here and adds
 * one line to `initModels`.
 */
import type { Sequelize } from 'sequelize'
import { getDb } from '../utils/db'
import { initAccountModels } from './accounts'
import { initAccountExtraModels } from './accounts-extra'
import { initCatalogueModels } from './catalogue'
import { initInspectionModels } from './inspections'
import { initQuoteModels } from './quotes'
import { initPriceFileModels } from './price-files'
import { initOrderModels } from './orders'
import { initGarageVehicleModels } from './garage-vehicles'
import { initSecondFactorModels } from './second-factor'
import { initCounterModels } from './counter'
import { initJobModels } from './jobs'
import { initMoneyOwedModels } from './money-owed'

export * from './accounts'
export * from './accounts-extra'
export * from './catalogue'
export * from './inspections'
export * from './quotes'
export * from './price-files'
export * from './orders'
export * from './garage-vehicles'
export * from './second-factor'
export * from './counter'
export * from './jobs'
export * from './money-owed'

let initialised: Sequelize | undefined

export function initModels(sequelize: Sequelize = getDb()): Sequelize {
  if (initialised === sequelize) return sequelize
  initAccountModels(sequelize)
  initAccountExtraModels(sequelize)
  initCatalogueModels(sequelize)
  initInspectionModels(sequelize)
  initQuoteModels(sequelize)
  initPriceFileModels(sequelize)
  initOrderModels(sequelize)
  initGarageVehicleModels(sequelize)
  initSecondFactorModels(sequelize)
  initCounterModels(sequelize)
  initJobModels(sequelize)
  initMoneyOwedModels(sequelize)
  initialised = sequelize
  return sequelize
}

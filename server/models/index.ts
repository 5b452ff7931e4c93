/**
 * Model registry. `initModels()` binds every model to the one Sequelize instance; the database plugin calls
 * it at start and scripts call it before use. Each domain keeps its models in its own file here and adds
 * one line to `initModels`.
 */
import type { Sequelize } from 'sequelize'
import { getDb } from '../utils/db'
import { initAccountModels } from './accounts'
import { initCatalogueModels } from './catalogue'

export * from './accounts'
export * from './catalogue'

let initialised: Sequelize | undefined

export function initModels(sequelize: Sequelize = getDb()): Sequelize {
  if (initialised === sequelize) return sequelize
  initAccountModels(sequelize)
  initCatalogueModels(sequelize)
  initialised = sequelize
  return sequelize
}

/**
 * Every migration, in order. Listed statically (not globbed) so the production bundle contains them.
 * Add a new file as NNNN-name.ts and one line here; never edit a migration that has landed.
 */
import type { QueryInterface } from 'sequelize'
import * as m0001 from './0001-foundation'
import * as m0002 from './0002-catalogue'

export interface Migration { name: string; up: (qi: QueryInterface) => Promise<void>; down: (qi: QueryInterface) => Promise<void> }

export const migrations: Migration[] = [
  { name: '0001-foundation', ...m0001 },
  { name: '0002-catalogue', ...m0002 },
]

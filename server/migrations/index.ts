/**
 * Every migration, in order. Listed statically (not globbed) so the production bundle contains them.
 * Add a new file as NNNN-name.ts and one line here; never edit a migration that has landed.
 */
import type { QueryInterface } from 'sequelize'
import * as m0001 from './0001-foundation'
import * as m0002 from './0002-catalogue'
import * as m0003 from './0003-accounts'
import * as m0004 from './0004-catalogue-extra'
import * as m0005 from './0005-inspections'
import * as m0006 from './0006-quotes'
import * as m0007 from './0007-price-lists'
import * as m0008 from './0008-orders'
import * as m0009 from './0009-current-prices'
import * as m0010 from './0010-one-vocabulary'
import * as m0011 from './0011-second-factor'
import * as m0012 from './0012-wheel-inspection'
import * as m0013 from './0013-garage-vehicles'
import * as m0014 from './0014-owner-money'
import * as m0015 from './0015-counter-day'
import * as m0016 from './0016-jobs'
import * as m0017 from './0017-money-owed'
import * as m0018 from './0018-owed-reminders'
import * as m0019 from './0019-several-processes'
import * as m0020 from './0020-steering-side'
import * as m0021 from './0021-dashboard-figures'
import * as m0023 from './0023-part-search-changes'
import * as m0024 from './0024-trade-day-figures'
import * as m0025 from './0025-parts-without-type-index'

export interface Migration { name: string; up: (qi: QueryInterface) => Promise<void>; down: (qi: QueryInterface) => Promise<void> }

export const migrations: Migration[] = [
  { name: '0001-foundation', ...m0001 },
  { name: '0002-catalogue', ...m0002 },
  { name: '0003-accounts', ...m0003 },
  { name: '0004-catalogue-extra', ...m0004 },
  { name: '0005-inspections', ...m0005 },
  { name: '0006-quotes', ...m0006 },
  { name: '0007-price-lists', ...m0007 },
  { name: '0008-orders', ...m0008 },
  { name: '0009-current-prices', ...m0009 },
  { name: '0010-one-vocabulary', ...m0010 },
  { name: '0011-second-factor', ...m0011 },
  { name: '0012-wheel-inspection', ...m0012 },
  { name: '0013-garage-vehicles', ...m0013 },
  { name: '0014-owner-money', ...m0014 },
  { name: '0015-counter-day', ...m0015 },
  { name: '0016-jobs', ...m0016 },
  { name: '0017-money-owed', ...m0017 },
  { name: '0018-owed-reminders', ...m0018 },
  { name: '0019-several-processes', ...m0019 },
  { name: '0020-steering-side', ...m0020 },
  { name: '0021-dashboard-figures', ...m0021 },
  { name: '0023-part-search-changes', ...m0023 },
  { name: '0024-trade-day-figures', ...m0024 },
  { name: '0025-parts-without-type-index', ...m0025 },
]

/** "Now" and the zone dates are told in: the request's (tests may move it), else the system clock. Plain Node. */
import { DEFAULT_FORMAT_SETTINGS } from '../../../shared/utils/format'

export interface ViewClock { now: Date; timeZone: string }

export const systemClock = (timeZone = DEFAULT_FORMAT_SETTINGS.timeZone): ViewClock => ({ now: new Date(), timeZone })

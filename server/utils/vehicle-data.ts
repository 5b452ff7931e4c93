/** The vehicle-data client's configuration and the national registration format, from the runtime config. */
import type { H3Event } from 'h3'
import type { VehicleDataConfig } from '../services/vehicle-data/client'
import type { RegistrationFormat } from '../../shared/utils/vehicles/registration'

export function vehicleDataConfig(event?: H3Event): VehicleDataConfig {
  const c = useRuntimeConfig(event)
  return {
    protocol: String(c.vehicleDataProtocol || 'http'), host: String(c.vehicleDataHost), port: Number(c.vehicleDataPort),
    key: String(c.vehicleDataKey), timeoutMs: Number(c.vehicleDataTimeoutMs) || 4000,
  }
}

export function registrationFormat(event?: H3Event): RegistrationFormat {
  return useRuntimeConfig(event).public.registrationFormat === 'uk' ? 'uk' : 'none'
}

/**
 * Starts the local vehicle-data fake: `tsx fakes/vehicle-data/index.ts` (or with the others: `npm run fakes`).
 * VEHICLE_DATA_FAKE_PORT (default 12112); the key it accepts is NUXT_VEHICLE_DATA_KEY (default vd_test_boreline_local),
 * the same variable the app's client sends.
 */
import { pathToFileURL } from 'node:url'
import { createVehicleDataFake, DEFAULT_VEHICLE_DATA_KEY, type VehicleDataFake } from './server'

export const DEFAULT_VEHICLE_DATA_FAKE_PORT = 12112

export async function startVehicleDataFake(env: NodeJS.ProcessEnv = process.env): Promise<{ fake: VehicleDataFake; port: number; url: string }> {
  const rawPort = env.VEHICLE_DATA_FAKE_PORT ?? String(DEFAULT_VEHICLE_DATA_FAKE_PORT)
  const port = Number(rawPort)
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`VEHICLE_DATA_FAKE_PORT must be a port number (0-65535), got "${rawPort}".`)
  }
  const fake = createVehicleDataFake({ port, apiKey: env.NUXT_VEHICLE_DATA_KEY || DEFAULT_VEHICLE_DATA_KEY })
  const { port: actual, url } = await fake.listen()
  return { fake, port: actual, url }
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href
if (isMain) {
  startVehicleDataFake()
    .then(({ fake, url }) => {
      console.log(`vehicle-data fake listening on ${url}`)
      const stop = (): void => { void fake.close().then(() => process.exit(0)) }
      process.once('SIGINT', stop)
      process.once('SIGTERM', stop)
    })
    .catch((e: unknown) => {
      console.error(`vehicle-data fake failed to start: ${e instanceof Error ? e.message : String(e)}`)
      process.exit(1)
    })
}

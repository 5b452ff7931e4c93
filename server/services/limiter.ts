/**
 * The throttles' counters: in this process's memory on SQLite (one process), in the database on PostgreSQL
 * (rate-limiter-flexible's PostgreSQL store, table `rate_limits`), so every server process counts the same
 * attempts. Made on first use, so importing a throttle never opens the database.
 */
import { RateLimiterMemory, RateLimiterPostgres, type IRateLimiterOptions, type RateLimiterAbstract, type RateLimiterRes } from 'rate-limiter-flexible'
import { getDb, isPostgres } from '../utils/db'

export class Limiter {
  private inner: RateLimiterAbstract | undefined
  constructor(private readonly opts: IRateLimiterOptions & { keyPrefix: string }) {}

  private store(): RateLimiterAbstract {
    this.inner ??= isPostgres()
      ? new RateLimiterPostgres({ ...this.opts, storeClient: getDb(), storeType: 'sequelize', tableName: 'rate_limits', tableCreated: true })
      : new RateLimiterMemory(this.opts)
    return this.inner
  }

  consume(key: string, points = 1): Promise<RateLimiterRes> { return this.store().consume(key, points) }
  reward(key: string, points = 1): Promise<RateLimiterRes> { return this.store().reward(key, points) }
  get(key: string): Promise<RateLimiterRes | null> { return this.store().get(key) }
  delete(key: string): Promise<boolean> { return this.store().delete(key) }
}

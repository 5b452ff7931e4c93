import { describe, expect, it } from 'vitest'
import { setup, $fetch, fetch } from '@nuxt/test-utils/e2e'
import { env } from '../support/api'
import { migrations } from '../../server/migrations/index'

await setup({ host: env().baseUrl })

describe('GET /api/health', () => {
  it('reports the database and the migrations applied', async () => {
    const body = await $fetch<{ status: string; database: string; migrations: number }>('/api/health')
    expect(body).toEqual({ status: 'ok', database: 'ok', migrations: migrations.length })
  })

  it('serves the home page from the built server', async () => {
    const res = await fetch('/')
    expect(res.status).toBe(200)
    expect(await res.text()).toContain('Boreline')
  })

  it('refuses a state-changing request sent from another site (ASVS 3.5.2)', async () => {
    const res = await fetch('/api/auth/sign-out', { method: 'POST', headers: { origin: 'http://elsewhere.test' } })
    expect(res.status).toBe(403)
  })
})

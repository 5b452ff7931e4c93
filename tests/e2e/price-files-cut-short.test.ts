/**
 * An apply cut short by a stopped process: the file must not stay "applying" for ever (nobody could apply it
 * again). The database rolled the apply back, so the file goes back to ready with the reason. On PostgreSQL,
 * where other processes may be applying right now, only a file whose row no running apply holds locked goes back.
 */
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, people } from '../support/api'
import { models, uid } from '../support/orders'
import { dbAll, onPostgres } from '../support/db'
import { getDb, withWrite } from '../../server/utils/db'
import { PriceFile } from '../../server/models/price-files'
import { recoverCutShortApplies } from '../../server/services/price-files/queue'

await setup({ host: env().baseUrl })

async function fileApplying(name: string): Promise<number> {
  models()
  const [counter] = await dbAll<{ id: number }>('SELECT id FROM users WHERE email = ?', [people.counter])
  const f = await withWrite((t) => PriceFile.create({
    status: 'applying', fileName: name, storedName: `cut-short-${uid()}.csv`, fileSize: 10, fileFormat: 'csv', createdByUserId: counter!.id,
  } as never, { transaction: t }))
  return f.id
}

describe('a price file left applying', () => {
  it('goes back to ready with why, and the counter can see it', async () => {
    const id = await fileApplying('cut-short.csv')
    expect(await recoverCutShortApplies()).toContain(id)
    const f = (await PriceFile.findByPk(id))!
    expect(f.status).toBe('ready')
    expect(f.errorMessage).toMatch(/stopped while this file was being applied; nothing was changed/)
    const seen = await (await as(people.counter)).get(`/api/price-files/${id}`)
    expect(seen.status).toBe(200)
    expect(JSON.stringify(seen.body)).toMatch(/Apply it again/)
  })

  it.runIf(onPostgres())('on PostgreSQL, stays applying while a running apply holds its row', async () => {
    const id = await fileApplying('still-applying.csv')
    const t = await getDb().transaction()
    try {
      await getDb().query('SELECT id FROM price_files WHERE id = :id FOR UPDATE', { replacements: { id }, transaction: t })
      expect(await recoverCutShortApplies()).not.toContain(id)
      expect((await PriceFile.findByPk(id))!.status).toBe('applying')
    } finally {
      await t.rollback()
    }
    expect(await recoverCutShortApplies()).toContain(id)
  })
})

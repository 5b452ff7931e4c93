import { describe, expect, it } from 'vitest'
import { newStoredName, storedPath } from '../../../server/services/stored-files'

const store = { folder: 'proofs', extensions: ['pdf', 'png'] }

describe('stored files', () => {
  it('makes 128-bit random names and resolves them inside their folder', () => {
    const name = newStoredName('pdf')
    expect(name).toMatch(/^[a-f0-9]{32}\.pdf$/)
    expect(storedPath('/srv/uploads', store, name)).toBe(`/srv/uploads/proofs/${name}`)
  })
  it.each(['../../etc/passwd', `${'a'.repeat(32)}.php`, `${'a'.repeat(32)}.pdf/../x`, 'short.pdf'])('refuses %s', (n) => {
    expect(() => storedPath('/srv/uploads', store, n)).toThrow()
  })
})

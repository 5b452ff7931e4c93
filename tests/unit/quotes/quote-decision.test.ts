import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { checkDecision, hashQuoteToken, newQuoteToken, orderLines } from '../../../server/services/quotes'
import type { QuoteLine } from '../../../server/models/quotes'

const line = (o: Partial<QuoteLine>) => ({ kind: 'part', recommendation: null, toldOwnerDeclinedRequired: false, parentLineId: null, position: 0, description: `line ${o.id}`, ...o }) as QuoteLine
const lines = [
  line({ id: 1, recommendation: 'required', description: 'Front discs' }),
  line({ id: 2, kind: 'core_deposit', parentLineId: 1 }),
  line({ id: 3, kind: 'labour' }),
  line({ id: 4, kind: 'sundry', recommendation: 'advised' }),
  line({ id: 5, kind: 'discount' }),
]

describe('the owner\'s decision', () => {
  it('covers exactly the lines offered: parts, labour and sundries', () => {
    const ok = checkDecision(lines, [{ id: 1, approved: true }, { id: 3, approved: true }, { id: 4, approved: false }])
    expect(ok).toEqual({ ok: true, approved: new Set([1, 3]), acknowledged: new Map() })
  })

  it('refuses lines not offered (core deposits, discounts, other quotes\') and choices twice', () => {
    const r = checkDecision(lines, [{ id: 1, approved: true }, { id: 3, approved: true }, { id: 4, approved: true }, { id: 2, approved: false }, { id: 5, approved: false }, { id: 99, approved: true }, { id: 3, approved: false }])
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(Object.keys(r.fields).sort()).toEqual(['lines.3.id', 'lines.4.id', 'lines.5.id', 'lines.6.id'])
  })

  it('names every line left open', () => {
    const r = checkDecision(lines, [{ id: 1, approved: true }])
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.fields.lines).toMatch(/"line 3", "line 4"/)
  })

  it('refuses declining a required line without the owner\'s signed acknowledgement, even when the garage talked it through', () => {
    const r = checkDecision(lines, [{ id: 1, approved: false }, { id: 3, approved: true }, { id: 4, approved: true }])
    expect(r.ok).toBe(false)
    if (!r.ok) {
      expect(r.fields['lines.0.acknowledgement']).toContain('"Front discs"')
      expect(r.message).toContain('Front discs')
    }
    const told = lines.map((l) => (l.id === 1 ? line({ ...l, toldOwnerDeclinedRequired: true }) : l))
    expect(checkDecision(told, [{ id: 1, approved: false }, { id: 3, approved: true }, { id: 4, approved: true }]).ok).toBe(false)
  })

  it('takes the acknowledgement with declining a required line, and refuses it anywhere else', () => {
    const signature = { understood: true as const, signedName: 'Robin Tester' }
    const ok = checkDecision(lines, [{ id: 1, approved: false, acknowledgement: signature }, { id: 3, approved: true }, { id: 4, approved: false }])
    expect(ok.ok).toBe(true)
    if (ok.ok) expect([...ok.acknowledged.entries()]).toEqual([[1, signature]])
    const stray = checkDecision(lines, [{ id: 1, approved: true, acknowledgement: signature }, { id: 3, approved: true }, { id: 4, approved: false, acknowledgement: signature }])
    expect(stray.ok).toBe(false)
    if (!stray.ok) expect(Object.keys(stray.fields).sort()).toEqual(['lines.0.acknowledgement', 'lines.2.acknowledgement'])
  })
})

describe('line order and tokens', () => {
  it('puts each core deposit straight after its part', () => {
    const rows = [line({ id: 7, position: 2 }), line({ id: 8, kind: 'core_deposit', parentLineId: 9, position: 1 }), line({ id: 9, position: 1 })]
    expect(orderLines(rows).map((l) => l.id)).toEqual([9, 8, 7])
  })

  it('makes 256-bit link tokens and keeps only their SHA-256 (FIPS 180-4 test vector "abc")', () => {
    const { token, hash } = newQuoteToken()
    expect(Buffer.from(token, 'base64url')).toHaveLength(32)
    expect(hash).toBe(hashQuoteToken(token))
    expect(hash).not.toContain(token)
    expect(hashQuoteToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad')
  })
})

describe('the PDF fonts shipped as server assets', () => {
  it('are the @fontsource/inter files byte for byte (refresh the copies when the package moves)', () => {
    const req = createRequire(import.meta.url)
    for (const f of ['inter-latin-400-normal.woff', 'inter-latin-700-normal.woff']) {
      const shipped = readFileSync(fileURLToPath(new URL(`../../../server/assets/fonts/${f}`, import.meta.url)))
      const pkg = readFileSync(req.resolve(`@fontsource/inter/files/${f}`))
      expect(shipped.equals(pkg), f).toBe(true)
    }
  })
})

import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { checkLogoFile, logoPath, svgProblem } from '../../../server/services/garage-logo'

const dir = mkdtempSync(join(tmpdir(), 'logo-test-'))
const file = (name: string, data: Buffer | string) => {
  const p = join(dir, name)
  writeFileSync(p, data)
  return { path: p, size: Buffer.byteLength(data), originalName: name }
}

describe('SVG logos', () => {
  it('accepts drawing-only SVG, with or without an XML declaration or a comment', () => {
    expect(svgProblem('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"><path d="M0 0h10v10z" fill="url(#g)"/></svg>')).toBeNull()
    expect(svgProblem('<?xml version="1.0" encoding="UTF-8"?>\n<!-- logo --><svg xmlns="http://www.w3.org/2000/svg"><text>AB</text></svg>')).toBeNull()
  })

  it('refuses script, handlers, embedded HTML, links, entities and external styles (OWASP: SVG can carry script)', () => {
    for (const svg of [
      '<svg><script>alert(1)</script></svg>',
      '<svg><svg:script>alert(1)</svg:script></svg>',
      '<svg onload="alert(1)"></svg>',
      '<svg><rect ONCLICK = "x()"/></svg>',
      '<svg><foreignObject><div/></foreignObject></svg>',
      '<svg><a href="https://elsewhere.test">x</a></svg>',
      '<svg><use xlink:href="other.svg#a"/></svg>',
      '<svg><image href="data:image/png;base64,AAAA"/></svg>',
      '<!DOCTYPE svg><svg></svg>',
      '<svg><style>@import "x.css";</style></svg>',
      '<svg><rect style="fill:url(http://elsewhere.test/p)"/></svg>',
      '<svg><set attributeName="onmouseover" to="alert(1)"/></svg>',
      '<svg><text>&#106;avascript</text></svg>',
    ]) expect(svgProblem(svg), svg).not.toBeNull()
    expect(svgProblem('<html><body>hi</body></html>')).toBe('This is not an SVG image.')
  })

  it('checks files by their bytes, not their names', async () => {
    const png = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64')
    expect(await checkLogoFile(file('a.svg', png))).toMatchObject({ mime: 'image/png', ext: 'png' })
    expect(await checkLogoFile(file('b.png', '<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg"/>'))).toMatchObject({ mime: 'image/svg+xml' })
    await expect(checkLogoFile(file('c.png', 'GIF89a....'))).rejects.toMatchObject({ kind: 'unsupported' })
    await expect(checkLogoFile(file('d.png', ''))).rejects.toMatchObject({ kind: 'unsupported' })
    await expect(checkLogoFile(null)).rejects.toMatchObject({ kind: 'invalid' })
  })

  it('stores only under its own names', () => {
    expect(() => logoPath('/tmp/u', '../../etc/passwd')).toThrow()
    expect(() => logoPath('/tmp/u', 'x.png.php')).toThrow()
    expect(logoPath('/tmp/u', `${'a'.repeat(32)}.png`)).toBe(`/tmp/u/logos/${'a'.repeat(32)}.png`)
  })
})

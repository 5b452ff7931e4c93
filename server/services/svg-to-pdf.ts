/**
 * Draws a drawing-only SVG logo (already vetted by garage-logo.ts) into a pdfkit document: rect, circle,
 * ellipse, line, polyline, polygon and path with fill/stroke colours, scaled from the viewBox into the box
 * given. Anything else (transforms, gradients, text, nested styling) makes it give up and return false, so the
 * PDF header shows the garage's name alone rather than a wrong drawing.
 */
import type PDFKit from 'pdfkit'

const SHAPES = new Set(['rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon', 'path'])
const ALLOWED = new Set([...SHAPES, 'svg', 'g', 'title', 'desc', 'metadata'])

function attrs(tag: string): Record<string, string> {
  const out: Record<string, string> = {}
  for (const m of tag.matchAll(/([\w:-]+)\s*=\s*("([^"]*)"|'([^']*)')/g)) out[m[1]!] = m[3] ?? m[4] ?? ''
  // style="fill:#123;stroke:none" counts like attributes
  for (const part of (out.style ?? '').split(';')) {
    const [k, v] = part.split(':').map((x) => x?.trim())
    if (k && v) out[k] = v
  }
  return out
}

const colour = (v: string | undefined) => (v && /^(#[0-9a-f]{3}|#[0-9a-f]{6}|[a-z]+)$/i.test(v) ? v : null)
const num = (v: string | undefined, d = 0) => (v === undefined || v === '' ? d : Number.parseFloat(v))

/** Returns whether the SVG was drawn. */
export function drawSvgLogo(doc: PDFKit.PDFDocument, svg: string, x: number, y: number, boxW: number, boxH: number): boolean {
  const body = svg.replace(/<\?xml[\s\S]*?\?>/g, '').replace(/<!--[\s\S]*?-->/g, '').replace(/<(title|desc|metadata)[\s\S]*?<\/\1>/gi, '')
  const tags = [...body.matchAll(/<\s*([a-zA-Z][\w:-]*)([^>]*)>/g)]
  if (!tags.length || tags[0]![1]!.toLowerCase() !== 'svg') return false
  if (tags.some((t) => !ALLOWED.has(t[1]!.toLowerCase()) || /\stransform\s*=/i.test(t[2]!))) return false
  if (/<\/?\s*text|url\(/i.test(body)) return false
  const root = attrs(tags[0]![2]!)
  const vb = (root.viewBox ?? root.viewbox ?? '').split(/[\s,]+/).map(Number)
  const [vx, vy, vw, vh] = vb.length === 4 && vb.every(Number.isFinite) ? vb : [0, 0, num(root.width, 100), num(root.height, 100)]
  if (!(vw! > 0 && vh! > 0)) return false
  const scale = Math.min(boxW / vw!, boxH / vh!)
  doc.save()
  doc.translate(x, y).scale(scale).translate(-vx!, -vy!)
  let drew = false
  const groupFill: (string | null)[] = []
  for (const [whole, rawName, rest] of tags.slice(1)) {
    const name = rawName!.toLowerCase()
    if (name === 'g') { if (!whole.endsWith('/>')) groupFill.push(colour(attrs(rest!).fill)); continue }
    if (!SHAPES.has(name)) continue
    const a = attrs(rest!)
    const inherited = groupFill.filter(Boolean).at(-1) ?? colour(root.fill) ?? '#000000'
    const fill = a.fill === 'none' ? null : colour(a.fill) ?? inherited
    const stroke = a.stroke && a.stroke !== 'none' ? colour(a.stroke) : null
    switch (name) {
      case 'rect':
        if (num(a.rx) > 0) doc.roundedRect(num(a.x), num(a.y), num(a.width), num(a.height), num(a.rx))
        else doc.rect(num(a.x), num(a.y), num(a.width), num(a.height))
        break
      case 'circle': doc.circle(num(a.cx), num(a.cy), num(a.r)); break
      case 'ellipse': doc.ellipse(num(a.cx), num(a.cy), num(a.rx), num(a.ry)); break
      case 'line': doc.moveTo(num(a.x1), num(a.y1)).lineTo(num(a.x2), num(a.y2)); break
      case 'polyline':
      case 'polygon': {
        const p = (a.points ?? '').trim().split(/[\s,]+/).map(Number)
        if (p.length < 4 || p.some((n) => !Number.isFinite(n))) continue
        const pts: [number, number][] = []
        for (let i = 0; i + 1 < p.length; i += 2) pts.push([p[i]!, p[i + 1]!])
        doc.polygon(...pts)
        break
      }
      case 'path': if (!a.d) continue; doc.path(a.d); break
    }
    if (stroke) doc.lineWidth(num(a['stroke-width'], 1))
    if (fill && stroke && name !== 'line') doc.fillAndStroke(fill, stroke)
    else if (fill && name !== 'line' && name !== 'polyline') doc.fill(fill)
    else if (stroke) doc.stroke(stroke)
    drew = true
  }
  doc.restore()
  return drew
}

/**
 * A dimensioned drawing of a part from its own figures, as plain shapes the app draws as SVG: a disc's face and
 * section (diameter, thickness, minimum thickness, vented or solid), a pad's outline and edge (width, height,
 * thickness), a drum's braking surface (diameter and maximum), a cylinder's bore and a caliper's pistons. The
 * outline is to scale within each view; the views are placed side by side at a size that reads, and each figure
 * is written in millimetres beside its dimension line. A part without the figures a view needs gets no drawing.
 */

export type Shape =
  | { kind: 'circle'; cx: number; cy: number; r: number; style: 'solid' | 'thin' | 'dashed' }
  | { kind: 'rect'; x: number; y: number; w: number; h: number; rx?: number; style: 'solid' | 'thin' | 'dashed' | 'hatch' }
  | { kind: 'path'; d: string; style: 'solid' | 'thin' | 'dashed' }
  /** a dimension line from (x1, y1) to (x2, y2) with arrows at both ends and its label beside the middle */
  | { kind: 'dimension'; x1: number; y1: number; x2: number; y2: number; label: string; side: 'above' | 'below' | 'left' | 'right' }
  | { kind: 'caption'; x: number; y: number; text: string; vertical?: boolean }

export interface PartDrawing { width: number; height: number; title: string; shapes: Shape[] }

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : null)
const mm = (v: number) => `${Number.isInteger(v) ? v : Number(v.toFixed(2))} mm`

function disc(s: Record<string, unknown>): PartDrawing | null {
  const d = num(s.diameterMm), t = num(s.thicknessMm)
  if (!d || !t) return null
  const min = num(s.minThicknessMm), vented = s.vented === true
  const r = 80, cx = 100, cy = 110, scale = (2 * r) / d
  const shapes: Shape[] = [
    { kind: 'circle', cx, cy, r, style: 'solid' },
    { kind: 'circle', cx, cy, r: r * 0.45, style: 'thin' },
    { kind: 'dimension', x1: cx - r, y1: cy + r + 14, x2: cx + r, y2: cy + r + 14, label: `Ø ${mm(d)}`, side: 'below' },
  ]
  if (num(s.centreBoreMm)) shapes.push({ kind: 'circle', cx, cy, r: Math.max(4, (num(s.centreBoreMm)! * scale) / 2), style: 'thin' })
  // the section: the friction ring's thickness at the same scale, at least wide enough to see
  const w = Math.max(12, t * scale), x = 250, top = cy - r
  if (vented) {
    const plate = w * 0.32
    shapes.push({ kind: 'rect', x, y: top, w: plate, h: 2 * r, style: 'hatch' })
    shapes.push({ kind: 'rect', x: x + w - plate, y: top, w: plate, h: 2 * r, style: 'hatch' })
    shapes.push({ kind: 'rect', x, y: top, w, h: 2 * r, style: 'thin' })
  } else {
    shapes.push({ kind: 'rect', x, y: top, w, h: 2 * r, style: 'hatch' })
  }
  shapes.push({ kind: 'dimension', x1: x, y1: top - 12, x2: x + w, y2: top - 12, label: mm(t), side: 'above' })
  if (min) {
    const wm = Math.max(8, Math.min(w - 2, min * scale))
    shapes.push({ kind: 'dimension', x1: x + (w - wm) / 2, y1: cy + r + 14, x2: x + (w + wm) / 2, y2: cy + r + 14, label: `min ${mm(min)}`, side: 'below' })
  }
  shapes.push({ kind: 'caption', x: x + w / 2, y: cy, text: vented ? 'vented' : 'solid', vertical: true })
  return { width: 340, height: 230, title: `Disc, ${mm(d)} by ${mm(t)}, ${vented ? 'vented' : 'solid'}${min ? `, minimum ${mm(min)}` : ''}`, shapes }
}

function pad(s: Record<string, unknown>): PartDrawing | null {
  const w = num(s.widthMm), h = num(s.heightMm), t = num(s.thicknessMm)
  if (!w || !h) return null
  const scale = Math.min(200 / w, 120 / h)
  const pw = w * scale, ph = h * scale, x = 20, y = 45
  // a pad's outline: the backing plate with its top edge following the disc's curve, ears at both ends
  const sag = Math.min(12, ph * 0.15)
  const outline = `M ${x} ${y + sag} Q ${x + pw / 2} ${y - sag} ${x + pw} ${y + sag} L ${x + pw} ${y + ph - 6} Q ${x + pw} ${y + ph} ${x + pw - 6} ${y + ph} L ${x + 6} ${y + ph} Q ${x} ${y + ph} ${x} ${y + ph - 6} Z`
  const shapes: Shape[] = [
    { kind: 'path', d: outline, style: 'solid' },
    { kind: 'dimension', x1: x, y1: y + ph + 16, x2: x + pw, y2: y + ph + 16, label: mm(w), side: 'below' },
    { kind: 'dimension', x1: x + pw + 14, y1: y, x2: x + pw + 14, y2: y + ph, label: mm(h), side: 'right' },
  ]
  if (t) {
    const tw = Math.max(10, t * scale), ex = x + pw + 80
    shapes.push({ kind: 'rect', x: ex, y, w: tw * 0.3, h: ph, style: 'solid' })
    shapes.push({ kind: 'rect', x: ex + tw * 0.3, y: y + 4, w: tw * 0.7, h: ph - 8, style: 'hatch' })
    shapes.push({ kind: 'dimension', x1: ex, y1: y - 12, x2: ex + tw, y2: y - 12, label: mm(t), side: 'above' })
    shapes.push({ kind: 'caption', x: ex + tw / 2, y: y + ph + 20, text: 'edge' })
  }
  return { width: 340, height: 230, title: `Brake pad, ${mm(w)} wide, ${mm(h)} high${t ? `, ${mm(t)} thick` : ''}`, shapes }
}

function drum(s: Record<string, unknown>): PartDrawing | null {
  const d = num(s.diameterMm)
  if (!d) return null
  const max = num(s.maxDiameterMm)
  const r = 85, cx = 170, cy = 110
  const shapes: Shape[] = [
    { kind: 'circle', cx, cy, r: r + 10, style: 'solid' },
    { kind: 'circle', cx, cy, r, style: 'solid' },
    { kind: 'circle', cx, cy, r: 22, style: 'thin' },
    { kind: 'dimension', x1: cx - r, y1: cy, x2: cx + r, y2: cy, label: `Ø ${mm(d)}`, side: 'above' },
  ]
  if (max) {
    const rm = r * Math.min(1.06, max / d)
    shapes.push({ kind: 'circle', cx, cy, r: rm, style: 'dashed' })
    shapes.push({ kind: 'dimension', x1: cx - rm, y1: cy + 44, x2: cx + rm, y2: cy + 44, label: `max Ø ${mm(max)}`, side: 'below' })
  }
  return { width: 340, height: 230, title: `Drum, braking surface ${mm(d)}${max ? `, maximum ${mm(max)}` : ''}`, shapes }
}

function cylinder(s: Record<string, unknown>, what: string, tandem: boolean): PartDrawing | null {
  const b = num(s.boreMm)
  if (!b) return null
  const len = tandem ? 230 : 150, x = (340 - len) / 2, cy = 105, bodyH = 90, boreH = 50
  const shapes: Shape[] = [
    { kind: 'rect', x, y: cy - bodyH / 2, w: len, h: bodyH, rx: 8, style: 'solid' },
    { kind: 'rect', x: x + 12, y: cy - boreH / 2, w: len - 24, h: boreH, style: 'dashed' },
    { kind: 'dimension', x1: x + len + 16, y1: cy - boreH / 2, x2: x + len + 16, y2: cy + boreH / 2, label: `bore ${mm(b)}`, side: 'right' },
  ]
  if (tandem) {
    shapes.push({ kind: 'rect', x: x + 30, y: cy - boreH / 2, w: 26, h: boreH, style: 'hatch' })
    shapes.push({ kind: 'rect', x: x + len / 2, y: cy - boreH / 2, w: 26, h: boreH, style: 'hatch' })
    shapes.push({ kind: 'caption', x: x + len / 2, y: cy + bodyH / 2 + 22, text: 'two pistons, two circuits' })
  } else {
    shapes.push({ kind: 'rect', x: x + 20, y: cy - boreH / 2, w: 24, h: boreH, style: 'hatch' })
    shapes.push({ kind: 'rect', x: x + len - 44, y: cy - boreH / 2, w: 24, h: boreH, style: 'hatch' })
  }
  return { width: 340, height: 200, title: `${what}, bore ${mm(b)}`, shapes }
}

function caliper(s: Record<string, unknown>): PartDrawing | null {
  const ds = Array.isArray(s.pistonDiametersMm) ? (s.pistonDiametersMm as unknown[]).map(num).filter((v): v is number => v !== null) : []
  if (!ds.length) return null
  const count = Math.max(num(s.pistonCount) ?? ds.length, ds.length)
  const pistons = Array.from({ length: count }, (_, i) => ds[i % ds.length]!)
  const biggest = Math.max(...pistons), scale = Math.min(1.6, 70 / biggest)
  const shapes: Shape[] = []
  let x = 30
  const cy = 100
  shapes.push({ kind: 'rect', x: 15, y: 30, w: 310, h: 140, rx: 16, style: 'thin' })
  for (const p of pistons.slice(0, 4)) {
    const r = (p * scale) / 2
    shapes.push({ kind: 'circle', cx: x + r, cy, r, style: 'solid' })
    shapes.push({ kind: 'dimension', x1: x, y1: cy + r + 14, x2: x + 2 * r, y2: cy + r + 14, label: `Ø ${mm(p)}`, side: 'below' })
    x += 2 * r + 18
  }
  return { width: 340, height: 210, title: `Caliper pistons: ${pistons.map(mm).join(', ')}`, shapes }
}

/** The drawing for a part type, or null when the part has no drawing or lacks the figures for one. */
export function partDrawing(type: string, specs: Record<string, unknown>): PartDrawing | null {
  switch (type) {
    case 'disc': return disc(specs)
    case 'pad_set': return pad(specs)
    case 'drum': return drum(specs)
    case 'wheel_cylinder': return cylinder(specs, 'Wheel cylinder', false)
    case 'master_cylinder': return cylinder(specs, 'Master cylinder', specs.tandem === true)
    case 'caliper': return caliper(specs)
    default: return null
  }
}

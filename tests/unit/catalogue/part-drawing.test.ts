import { describe, expect, it } from 'vitest'
import { partDrawing, type Shape } from '#shared/utils/catalogue/part-drawing'

const labels = (shapes: Shape[]) => shapes.flatMap((s) => (s.kind === 'dimension' ? [s.label] : s.kind === 'caption' ? [s.text] : []))

// The figures are the part's own; what is checked is that each one is written with its unit, and that the outline
// keeps the part's proportions (worked by hand below), not a house shape.
describe('dimensioned part drawings', () => {
  it('a vented disc shows diameter, thickness and minimum thickness in mm', () => {
    const d = partDrawing('disc', { diameterMm: 288, thicknessMm: 25, minThicknessMm: 22, vented: true, centreBoreMm: 65 })!
    expect(labels(d.shapes)).toEqual(['Ø 288 mm', '25 mm', 'min 22 mm', 'vented'])
    expect(d.title).toBe('Disc, 288 mm by 25 mm, vented, minimum 22 mm')
    // face circle r = 80 stands for 144 mm, so the 25 mm section is 25 × 160/288 = 13.9 units wide
    const section = d.shapes.find((s) => s.kind === 'rect' && s.style === 'thin')
    expect(section && section.kind === 'rect' ? section.w : 0).toBeCloseTo(13.89, 2)
  })

  it('a pad keeps its width to height ratio', () => {
    const d = partDrawing('pad_set', { widthMm: 155.1, heightMm: 63.9, thicknessMm: 18.3 })!
    expect(labels(d.shapes)).toEqual(['155.1 mm', '63.9 mm', '18.3 mm', 'edge'])
    // scale = min(200/155.1, 120/63.9) = 1.2895; width 200, height 63.9 × 1.2895 = 82.4
    const [w, h] = d.shapes.filter((s) => s.kind === 'dimension').slice(0, 2).map((s) => (s.kind === 'dimension' ? Math.hypot(s.x2 - s.x1, s.y2 - s.y1) : 0))
    expect(w).toBeCloseTo(200, 1)
    expect(h).toBeCloseTo(82.40, 1)
  })

  it('a drum shows its diameter and the maximum it may be turned to; cylinders their bore', () => {
    expect(labels(partDrawing('drum', { diameterMm: 228.6, maxDiameterMm: 229.6 })!.shapes)).toEqual(['Ø 228.6 mm', 'max Ø 229.6 mm'])
    expect(labels(partDrawing('wheel_cylinder', { boreMm: 20.64 })!.shapes)).toEqual(['bore 20.64 mm'])
    expect(labels(partDrawing('master_cylinder', { boreMm: 22.22, tandem: true })!.shapes)).toEqual(['bore 22.22 mm', 'two pistons, two circuits'])
    expect(labels(partDrawing('caliper', { pistonCount: 2, pistonDiametersMm: [38, 42] })!.shapes)).toEqual(['Ø 38 mm', 'Ø 42 mm'])
  })

  it('no drawing without the figures it needs, or for parts that have none', () => {
    expect(partDrawing('disc', { diameterMm: 288 })).toBeNull()
    expect(partDrawing('fluid', { grade: 'DOT 4', volumeMl: 1000 })).toBeNull()
  })
})

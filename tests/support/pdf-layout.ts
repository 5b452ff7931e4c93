/**
 * Text boxes of a PDF, read back with pdf.js (the copy pdf-parse v1 ships), to check a layout: every piece of
 * text becomes a box on its page, and two boxes that cover each other mean one figure is printed over another.
 * A glyph box runs from the baseline less the descender (about 0.22 of the font size for Inter) to the cap
 * height and ascender (about 0.78 above it); boxes that only touch or overlap by less than `slack` points are
 * treated as neighbours, as a tight line spacing is not an overlap.
 */
// pdf-parse v1's library entry (its index.js runs a self-test when imported)
import pdf from 'pdf-parse/lib/pdf-parse.js'

export interface TextBox { page: number; text: string; x0: number; x1: number; y0: number; y1: number }

interface PdfTextItem { str: string; transform: number[]; width: number }
interface PdfPageData { pageIndex: number; getTextContent: (o: object) => Promise<{ items: PdfTextItem[] }> }

export async function textBoxes(bytes: Buffer): Promise<TextBox[]> {
  const boxes: TextBox[] = []
  await pdf(Buffer.from(new Uint8Array(bytes)), {
    pagerender: async (page: PdfPageData) => {
      const content = await page.getTextContent({ normalizeWhitespace: false, disableCombineTextItems: true })
      for (const item of content.items) {
        if (!item.str.trim()) continue
        const [, , , size = 0, x = 0, y = 0] = item.transform
        boxes.push({ page: page.pageIndex, text: item.str, x0: x, x1: x + item.width, y0: y - 0.22 * size, y1: y + 0.78 * size })
      }
      return ''
    },
  })
  return boxes
}

/** Pairs of boxes on the same page that overlap by more than `slack` points both across and down. */
export function overlaps(boxes: TextBox[], slack = 0.5): Array<[TextBox, TextBox]> {
  const found: Array<[TextBox, TextBox]> = []
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i]!, b = boxes[j]!
      if (a.page !== b.page) continue
      const across = Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0)
      const down = Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0)
      if (across > slack && down > slack) found.push([a, b])
    }
  }
  return found
}

/** A readable list of the overlapping pairs, for a failing assertion's message. */
export function describeOverlaps(pairs: Array<[TextBox, TextBox]>): string[] {
  return pairs.map(([a, b]) => `page ${a.page + 1}: "${a.text}" over "${b.text}"`)
}

/**
 * Inter regular and bold for every PDF, copied from @fontsource/inter into server/assets/fonts and read through
 * Nitro's server assets (bundled into .output; a unit test fails when the copies drift from the package).
 */
import type { PdfFonts } from '../services/pdf/document'

let fonts: Promise<PdfFonts> | undefined

export function pdfFonts(): Promise<PdfFonts> {
  fonts ??= (async () => {
    const storage = useStorage('assets:server')
    const read = async (name: string) => {
      const raw = await storage.getItemRaw(`fonts/${name}`)
      if (!raw) throw new Error(`font ${name} is missing from the server assets`)
      return Buffer.from(raw as Uint8Array)
    }
    return { regular: await read('inter-latin-400-normal.woff'), bold: await read('inter-latin-700-normal.woff') }
  })().catch((err) => { fonts = undefined; throw err })
  return fonts
}

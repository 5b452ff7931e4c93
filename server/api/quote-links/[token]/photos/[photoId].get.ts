/**
 * GET /api/quote-links/:token/photos/:photoId -> a photo of the inspection this quote was drafted from, for the
 * owner's page (nosniff, sandbox CSP, never cached). 404 when the link is not valid or the photo is not one of
 * that inspection's.
 */
import { z } from 'zod'
import { photoHeaders, readQuotePhoto } from '../../../../services/inspection-photos'

const PhotoParams = z.object({ photoId: z.coerce.number().int().positive() })

export default defineEventHandler(async (event) => {
  const { quote } = await loadLinkedQuote(event, getRouterParam(event, 'token'))
  const parsed = PhotoParams.safeParse({ photoId: getRouterParam(event, 'photoId') })
  if (!parsed.success) throw notFound('Photo')
  const photo = await readQuotePhoto({ organisationId: quote.organisationId, inspectionId: quote.inspectionId ?? null }, parsed.data.photoId, String(useRuntimeConfig(event).uploadsDir))
  setResponseHeaders(event, photoHeaders(photo.mime, 'no-store'))
  return photo.data
})

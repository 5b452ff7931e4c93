/**
 * POST /api/parts/:sku/fitments  { vehicleId, axle, side, quantity, qualifiers: { option key: value }, note }
 * -> 201 { id }. The axle must be the part's own (or "all" for master cylinders and fluid), qualifiers must name the
 * vehicle's options and values, and a part whose bore or size differs from the vehicle's original needs a note.
 */
import { FitmentInputSchema } from '#shared/schemas/catalogue/fitments'
import { SkuParamsSchema } from '#shared/schemas/catalogue/params'
import { addFitment } from '../../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { sku } = paramsWith(event, SkuParamsSchema)
  const input = await bodyWith(event, FitmentInputSchema)
  const f = await addFitment(user.id, sku, input)
  setResponseStatus(event, 201)
  return { id: f.id }
})

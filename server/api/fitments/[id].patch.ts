/** PATCH /api/fitments/:id  { axle?, side?, quantity?, qualifiers?, note? } -> { id }. Same checks as adding. Audited. */
import { FitmentPatchSchema } from '#shared/schemas/catalogue/fitments'
import { FitmentIdParamsSchema } from '#shared/schemas/catalogue/params'
import { patchFitment } from '../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { id } = paramsWith(event, FitmentIdParamsSchema)
  const input = await bodyWith(event, FitmentPatchSchema)
  const f = await patchFitment(user.id, id, input)
  return { id: f.id }
})

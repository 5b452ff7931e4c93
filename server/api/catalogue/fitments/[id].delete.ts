/** DELETE /api/catalogue/fitments/:id -> 204. Audited. */
import { FitmentIdParamsSchema } from '#shared/schemas/parts'
import { catalogueHttpError } from '../../../services/catalogue/http'
import { deleteFitment } from '../../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { id } = paramsWith(event, FitmentIdParamsSchema)
  try {
    await deleteFitment(user.id, id)
  } catch (err) {
    throw catalogueHttpError(err)
  }
  setResponseStatus(event, 204)
  return null
})

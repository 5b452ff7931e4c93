/** DELETE /api/fitments/:id -> 204. Audited. */
import { FitmentIdParamsSchema } from '#shared/schemas/catalogue/params'
import { deleteFitment } from '../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { id } = paramsWith(event, FitmentIdParamsSchema)
  await deleteFitment(user.id, id)
  setResponseStatus(event, 204)
  return null
})

/**
 * POST /api/parts  { sku, type, productLine, description, specs, oeNumbers: [{ oeNumber, maker }] }
 * -> 201 { sku }. Counter staff and the distributor admin. `specs` is checked against the type's schema
 * (422 with `data.fields["specs.<field>"]`); 409 when the SKU (or a superseded SKU) is taken. Audited.
 */
import { PartCreateSchema } from '#shared/schemas/catalogue/upkeep'
import { createPart } from '../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const input = await bodyWith(event, PartCreateSchema)
  const part = await createPart(user.id, input)
  setResponseStatus(event, 201)
  return { sku: part.sku }
})

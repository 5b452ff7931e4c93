/**
 * GET /api/garage/customers/:id -> GarageCustomerView: one of the caller's garage's customers.
 * 401; 403 without `vehicles.use`; 404 not the garage's customer; 422 bad id.
 */
import { IdParamsSchema } from '#shared/schemas/garage-vehicles'
import { customerOf, customerView } from '../../../../services/garage-vehicles/customers'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'vehicles.use')
  const { id } = paramsWith(event, IdParamsSchema)
  return customerView(await customerOf(org.id, id))
})

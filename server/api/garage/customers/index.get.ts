/**
 * GET /api/garage/customers?q=&page=&pageSize= -> Page<GarageCustomerView>: the caller's garage's customers
 * (vehicle owners) by name, e-mail or phone, each with how many vehicles they have.
 * 401 signed out; 403 without `vehicles.use`; 422 bad query.
 */
import { GarageCustomerListQuerySchema } from '#shared/schemas/garage-vehicles'
import { listCustomers } from '../../../services/garage-vehicles/customers'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'vehicles.use')
  return listCustomers(org.id, queryWith(event, GarageCustomerListQuerySchema))
})

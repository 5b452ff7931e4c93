/**
 * GET /api/parts?q=&type=&axle=&page=&pageSize=&<dim>Mm=&<dim>Min=&<dim>Max=
 * (dims: diameter, bore, piston, thickness, width, length; e.g. `boreMm=22.22`, `diameterMin=280&diameterMax=300`)
 * -> `Page<part>`: `{ data: [{ sku, type, description, productLine, status, axle, specs, stock, stockTotal, match,
 * ...prices }], meta: { page, pageSize, total, pages, priceVersion, understood } }`.
 * `q` takes SKUs, OE numbers, superseded SKUs (the replacement is listed, `match.replaces` says so) and words, with
 * prefix and typo tolerance; exact identifiers rank first. 401 signed out; 422 names a malformed filter.
 */
import { PartListQuerySchema, partListQueryOf } from '#shared/schemas/catalogue/list-query'
import { searchParts } from '../../services/catalogue/parts'
import { catalogueContext } from '../../services/catalogue/context'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'catalogue.view')
  const query = partListQueryOf(queryWith(event, PartListQuerySchema))
  return searchParts(query, await catalogueContext(user, org))
})

/** Maps catalogue errors onto the product's HTTP error shapes (422 with `data.fields`, 404, 409). */
import { createError } from 'h3'
import { ZodError } from 'zod'
import { fieldErrors, invalidInput } from '../../utils/validate'
import { UpkeepError } from './upkeep'
import { AnswerError } from './vehicle-parts'

export function catalogueHttpError(err: unknown): unknown {
  if (err instanceof ZodError) return invalidInput(fieldErrors(err.issues))
  if (err instanceof AnswerError) return invalidInput(err.fields, 'Some option answers do not fit this vehicle.')
  if (err instanceof UpkeepError) {
    if (err.status === 422) return invalidInput(err.fields, err.message)
    return createError({ statusCode: err.status, statusMessage: err.status === 404 ? 'Not Found' : 'Conflict', message: err.message, data: { fields: err.fields } })
  }
  return err
}

/**
 * The two endpoint shapes most objects share: create (check the parameters, make the object, answer it
 * expanded as asked) and retrieve by id (with `expand[]`).
 */
import type { z } from 'zod'
import { route, type Fake, type RequestContext, type Route } from './context'
import type { FormObject } from './form'
import { expand } from './listing'
import { expandOnly, parse } from './params'

export function createEndpoint<S extends z.ZodType<{ expand?: string[] }, unknown>>(
  fake: Fake,
  pattern: RegExp,
  schema: S,
  make: (params: z.output<S>, ctx: RequestContext) => object,
): Route {
  return route('POST', pattern, (raw: FormObject, _ids, ctx) => {
    const p = parse(schema, raw)
    return { body: expand(fake.state, make(p, ctx), p.expand) }
  })
}

/** `find` throws the 404 for an unknown id. */
export function retrieveEndpoint(fake: Fake, pattern: RegExp, find: (id: string) => object): Route {
  return route('GET', pattern, (raw, [id]) => {
    const p = parse(expandOnly, raw)
    return { body: expand(fake.state, find(id as string), p.expand) }
  })
}

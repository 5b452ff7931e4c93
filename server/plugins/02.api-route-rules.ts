/**
 * The route rules of an API request, worked out once instead of on every request.
 *
 * Nitro (headers of `routeRules`) and the security module (`nuxt-security`: its headers, nonce, limiters) each
 * resolve per request which of their route patterns apply to the path. The module builds a new router from a deep
 * copy of all its options every time, Nitro matches and merges its rules; under the vehicle-parts load
 * (bench/catalogue.ts, 50 connections) the two were ~12 % of the server's CPU and a fifth of what each request
 * allocated. For a path under /api/ the answer is always the same as long as no pattern but the catch-all `/**`
 * can match such a path: then the first API request's resolved rules (the frameworks' own result) are kept, frozen,
 * and handed to every later API request before either looks (both keep their result on the event and read it
 * from there: `event.context._nitro.routeRules`, `event.context.security`). Any other pattern that could reach
 * /api/ (or rules added while running) and both resolve per request as before.
 *
 * Registered before the module's plugins (server plugins run first), so these hooks run ahead of the module's.
 */
import type { H3Event } from 'h3'

type Rules = Record<string, unknown>
interface SecurityContext { rules?: Rules; route?: string; nonce?: string }
/** BORELINE_SHARED_ROUTE_RULES=0 resolves them per request as the frameworks do (to compare). */
const on = process.env.BORELINE_SHARED_ROUTE_RULES !== '0'

/** Whether a rule pattern can match a path under /api/ other than as the catch-all. */
export function patternReachesApi(pattern: string): boolean {
  if (pattern === '/**' || pattern === '/') return false
  const first = pattern.split('/')[1] ?? ''
  return first === 'api' || first === '' || /[*:]/.test(first)
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value)
    for (const v of Object.values(value)) deepFreeze(v)
  }
  return value
}

const isApi = (event: H3Event) => event.path.startsWith('/api/')

export default defineNitroPlugin((nitro) => {
  const config = useRuntimeConfig()
  const nitroRules = (config.nitro as { routeRules?: Record<string, unknown> } | undefined)?.routeRules ?? {}
  const nitroShared = on && config.app.baseURL === '/' && !Object.keys(nitroRules).some(patternReachesApi)
  let securityShared = false
  let kept: { nitro?: Rules; security?: { rules: Rules; route?: string } } = {}

  // the module hands its options to this hook once they are complete; rules added later per route end the sharing
  nitro.hooks.hook('nuxt-security:routeRules', (options) => {
    securityShared = on && !Object.keys(options).some(patternReachesApi)
  })
  nitro.hooks.hook('nuxt-security:headers', () => { securityShared = false; kept = { nitro: kept.nitro } })

  nitro.hooks.hook('request', (event) => {
    if (!isApi(event)) return
    if (nitroShared && kept.nitro) {
      const ctx = (event.context._nitro ??= {}) as { routeRules?: Rules }
      ctx.routeRules ??= kept.nitro
    }
    if (securityShared && kept.security && !event.context.security) {
      const { rules, route } = kept.security
      event.context.security = (route === undefined ? { rules } : { rules, route }) satisfies SecurityContext
    }
  })

  nitro.hooks.hook('afterResponse', (event) => {
    if (!isApi(event) || (kept.nitro && kept.security)) return
    const nitroCtx = event.context._nitro as { routeRules?: Rules } | undefined
    if (nitroShared && !kept.nitro && nitroCtx?.routeRules) kept.nitro = deepFreeze(structuredClone(nitroCtx.routeRules))
    const security = event.context.security as SecurityContext | undefined
    if (securityShared && !kept.security && security?.rules) {
      kept.security = { rules: deepFreeze(structuredClone(security.rules)), ...(security.route ? { route: security.route } : {}) }
    }
  })

  // a page rendered for an API path (an unknown one, asked for by a browser) writes its nonce into the rules:
  // it gets a private copy first
  nitro.hooks.hook('render:html', (_html, { event }) => {
    const security = event.context.security as SecurityContext | undefined
    if (security?.rules && Object.isFrozen(security.rules)) security.rules = structuredClone(security.rules)
    const nitroCtx = event.context._nitro as { routeRules?: Rules } | undefined
    if (nitroCtx?.routeRules && Object.isFrozen(nitroCtx.routeRules)) nitroCtx.routeRules = structuredClone(nitroCtx.routeRules)
  })
})

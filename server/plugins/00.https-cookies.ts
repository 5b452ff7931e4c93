/**
 * Served over HTTPS (the public origin says so), the session cookie takes the `__Host-` prefix: the browser then
 * keeps it only if it is Secure, has path `/` and no domain, so no other host or subdomain can plant or overwrite it.
 * Set through the environment before the first request, so nuxt-auth-utils and the session middleware read the same
 * name; an explicit NUXT_SESSION_NAME wins.
 */
export default defineNitroPlugin(() => {
  const config = useRuntimeConfig()
  if (!String(config.publicOrigin).startsWith('https://') || process.env.NUXT_SESSION_NAME) return
  const name = (config.session as { name?: string }).name || 'boreline-session'
  process.env.NUXT_SESSION_NAME = name.startsWith('__Host-') ? name : `__Host-${name}`
})

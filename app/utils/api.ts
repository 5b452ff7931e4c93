/**
 * A request to one of Boreline's own routes, answered as the type the caller names (the shared types in
 * `shared/types`). Nitro types `$fetch` by matching the URL against every route it knows; with this many routes
 * TypeScript gives up on that matching ("excessive stack depth comparing types"), so the app's requests come
 * through here: `$fetch` seen as a plain function, the answer typed by the caller.
 */
export interface ApiOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  body?: unknown
  query?: Record<string, unknown>
  headers?: Record<string, string>
}

type PlainFetch = (url: string, options?: ApiOptions) => Promise<unknown>

export function api<T = unknown>(url: string, options?: ApiOptions): Promise<T> {
  // looked up at each call: the global is set up by Nuxt, after this module may have been read
  return ($fetch as unknown as PlainFetch)(url, options) as Promise<T>
}

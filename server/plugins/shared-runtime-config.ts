/**
 * Every request reads the one runtime configuration made at start-up. Without this, the first
 * `useRuntimeConfig(event)` of each request (the page renderer, the session helpers and the
 * security headers all call it) deep-copies the whole configuration and looks every key up in the
 * environment again: on a Node server the environment does not change between requests, and that
 * copy was about a seventh of the CPU of rendering a page. The shared configuration is frozen, so
 * code that tried to change it for one request would fail loudly instead of changing it for all.
 */
export default defineNitroPlugin((nitro) => {
  const shared = useRuntimeConfig()
  nitro.hooks.hook('request', (event) => {
    event.context.nitro ??= { errors: [] }
    event.context.nitro.runtimeConfig ??= shared
  })
})

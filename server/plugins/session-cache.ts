/**
 * Every request starts with its session already open when its cookie was opened lately, and keeps
 * what it opened for the next ones (server/utils/session-cache.ts): nuxt-auth-utils' own session
 * route, which every server-rendered page asks, goes through here too.
 */
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('request', (event) => {
    primeSession(event)
  })
  nitro.hooks.hook('beforeResponse', (event) => {
    keepSession(event)
  })
})

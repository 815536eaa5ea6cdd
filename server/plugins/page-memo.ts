/**
 * Keeps each signed-in page as it leaves (server/utils/page-memo.ts): the HTML as the renderer made
 * it, before the compression plugin gzips it, with the headers every other hook has set by the time
 * the response is sent (nuxt-security's among them), whichever order the plugins run in.
 */
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('render:response', (response, { event }) => {
    noteDrawnPage(event, response.body)
  })
  nitro.hooks.hook('beforeResponse', (event) => {
    keepDrawnPage(event)
  })
})

/**
 * An address under /api that no route answers gets JSON and a 404. Without this the page
 * renderer would take it and send a signed-out caller to the HTML sign-in page. Registered here
 * rather than as a server/routes file so that the typed routes of `useFetch` stay exact; the
 * router prefers every named route over this wildcard.
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.router.use('/api/**', defineEventHandler(() => {
    throw httpError(404, 'There is no such address in the Sealwright API. Check the path and method.')
  }))
})

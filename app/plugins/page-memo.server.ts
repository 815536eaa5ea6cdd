/**
 * A page whose render erred, or any of whose reads came back with an error, is drawn for this
 * request only and never sent again from the server's page memo (server/utils/page-memo.ts).
 */
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.hook('app:rendered', ({ ssrContext }) => {
    const failed = Boolean(ssrContext?.error) || Object.values(nuxtApp.payload._errors ?? {}).some(Boolean)
    const memo = ssrContext?.event.context.pageMemo as { refused?: boolean } | undefined
    if (failed && memo) memo.refused = true
  })
})

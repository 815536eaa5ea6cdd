import { compress } from 'h3-compression'

const COMPRESSIBLE = /^(text\/|application\/(json|javascript|xml)|image\/svg\+xml)/

/**
 * Gzips pages and API answers of 1 kB or more for clients that accept it. It runs before the
 * response is sent, after every render hook (nuxt-security writes its nonces into the HTML there),
 * so the page is compressed as sent. Built assets are compressed at build time instead
 * (`compressPublicAssets`), and anything already encoded (or a PDF) is left as it is.
 */
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('beforeResponse', async (event, response) => {
    if (event.method === 'HEAD' || getResponseHeader(event, 'content-encoding')) return
    // The error page is rendered by an internal request whose body the error handler reads as
    // text and sends on: compressing it here would send gzip bytes as if they were HTML.
    if (event.path.startsWith('/__nuxt_error')) return
    const body = response.body
    const type = String(getResponseHeader(event, 'content-type') ?? (body !== null && typeof body === 'object' && !(body instanceof Uint8Array) ? 'application/json' : ''))
    if (!COMPRESSIBLE.test(type)) return
    appendResponseHeader(event, 'vary', 'accept-encoding')
    await compress(event, response, 'gzip', { minSize: 1024 })
  })
})

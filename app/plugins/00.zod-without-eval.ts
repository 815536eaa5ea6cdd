import { config } from 'zod'

// zod compiles fast parsers with `new Function` when it may; the Content-Security-Policy forbids
// eval, so its probe would be refused (and reported) on every page. Parse without it from the start:
// this runs when the module loads, before any page's schemas are built.
config({ jitless: true })

export default defineNuxtPlugin({
  name: 'zod-without-eval',
  enforce: 'pre',
  setup() {}
})

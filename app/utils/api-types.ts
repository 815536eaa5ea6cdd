import type { InternalApi, Serialize } from 'nitropack/types'

/** What a GET route answers, as the browser receives it (dates as strings): the route's own type, never a copy. */
export type ApiGet<Route extends keyof InternalApi> = InternalApi[Route] extends { get: infer T } ? Serialize<Awaited<T>> : never

/** One fit-test revision as the result page reads it. */
export type FitTestDetail = ApiGet<'/api/fit-tests/:id'>
/** What the "New fit test" form chooses from. */
export type FitTestOptions = ApiGet<'/api/fit-test-options'>

import type { InternalApi, Serialize } from 'nitropack/types'

/** What a GET route answers, as the browser receives it (dates as strings): the route's own type, never a copy. */
export type ApiGet<Route extends keyof InternalApi> = InternalApi[Route] extends { get: infer T } ? Serialize<Awaited<T>> : never

/** One fit-test revision as the result page reads it. */
export type FitTestDetail = ApiGet<'/api/fit-tests/:id'>
/** What the "New fit test" form chooses from. */
export type FitTestOptions = ApiGet<'/api/fit-test-options'>
/** One account in the users table (never its password hash: the route sends `hasPassword`). */
export type UserListRow = ApiGet<'/api/users'>[number]
/** One counter in the equipment list, with its site's name. */
export type CounterListRow = ApiGet<'/api/counters'>[number]
/** One bench rig in the equipment list, with its site's name and its counter's serial. */
export type BenchRigListRow = ApiGet<'/api/bench-rigs'>[number]
/** One practice test as its page and editor read it. */
export type PracticeTestDetail = ApiGet<'/api/practice-tests/:id'>
/** One row of the fit-test list; the person page's tests have the same shape. */
export type FitTestListRow = ApiGet<'/api/fit-tests'>['rows'][number] | ApiGet<'/api/people/:id'>['tests'][number]
/** One person on the due list, with what is due. */
export type DueListRow = ApiGet<'/api/due-list'>['rows'][number]
/** The person page: the person and everything shown about them. */
export type PersonDetail = ApiGet<'/api/people/:id'>

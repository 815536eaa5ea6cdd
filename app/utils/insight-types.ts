import type { ApiGet } from './api-types'

/**
 * What each insights route answers, as the browser receives it: inferred from the routes, never
 * copied. A panel's `data` is one of these, or nothing yet while it loads.
 */
export type InsightPanelData<Route extends '/api/insights/pass-rates' | '/api/insights/models' | '/api/insights/exercises' | '/api/insights/drift' | '/api/insights/testers' | '/api/insights/coverage'> = ApiGet<Route> | null | undefined

/** A pass rate with its Wilson 95 % interval, or without one when the group is small. */
export type InsightRate = ApiGet<'/api/insights/pass-rates'>['periods'][number]['all']

/** The choices of the filter bar. */
export type InsightOptions = ApiGet<'/api/insights/options'>

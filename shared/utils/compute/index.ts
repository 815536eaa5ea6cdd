// Sealwright computation module: pure functions of plain data, shared by the server (which
// stores only raw inputs and recomputes) and the browser (which previews the same numbers).
// Import it as '#shared/utils/compute'. See README.md in this folder for the API.

export * from './errors'
export * from './sources'
export * from './cautions'
export * from './counting-stats'
export * from './fit-factor'
export * from './protocols'
export * from './respirator-classes'
export * from './pass-levels'
export * from './fit-test'
export * from './count-series'
export * from './test-length'
export * from './simulation'
export * from './acceptance'
export * from './headform'
export * from './selection'
export * from './summaries'
export * from './insight-stats'
export * from './movements'
export * from './selection-classes'
// The exposure arithmetic (exposure.ts, exposure-assessment.ts) carries mathjs: import it from
// '#shared/utils/compute/exposure-assessment' on the pages that need it.

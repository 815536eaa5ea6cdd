import { refreshStaleInsightFacts } from '../database/insight-facts'

// Results loaded without the finish route (the demo seed, history imports) get their per-exercise
// insight rows once the server is up, then their rows in the insights summary. A failure is
// logged; insights then show fewer results until `npm run insights:rebuild`.
export default defineNitroPlugin(() => {
  if (import.meta.prerender) return
  setTimeout(() => {
    backfillExerciseResults()
      .then((n) => { if (n > 0) console.info(`[insights] exercise rows filled for ${n} results`) })
      .then(() => refreshStaleInsightFacts(useDb()))
      .then((n) => { if (n > 0) console.info(`[insights] summary brought up to date for ${n} records`) })
      .catch((error: Error) => console.warn(`[insights] exercise rows or summary not filled: ${error.message}`))
  }, 500)
})

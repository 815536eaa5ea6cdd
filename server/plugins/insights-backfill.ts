// Results loaded without the finish route (the demo seed, history imports) get their per-exercise
// insight rows once the server is up. A failure is logged; insights then show fewer exercises.
export default defineNitroPlugin(() => {
  if (import.meta.prerender) return
  setTimeout(() => {
    backfillExerciseResults()
      .then((n) => { if (n > 0) console.info(`[insights] exercise rows filled for ${n} results`) })
      .catch((error: Error) => console.warn(`[insights] exercise rows not filled: ${error.message}`))
  }, 500)
})

// Finished results stored without their computed result (loaded before results were stored, or by
// a script) get it once the server is up, so their pages never recompute it. A failure is logged;
// those pages then recompute on each read, as before.
export default defineNitroPlugin(() => {
  if (import.meta.prerender) return
  setTimeout(() => {
    backfillStoredEvaluations()
      .then(({ stored, disagreeing }) => {
        if (stored > 0) console.info(`[results] computed result stored for ${stored} finished tests`)
        if (disagreeing > 0) console.warn(`[results] ${disagreeing} finished tests recompute to a different result than stored; left to be recomputed on each read`)
      })
      .catch((error: Error) => console.warn(`[results] computed results not stored: ${error.message}`))
  }, 500)
})

/** Countersign, query and answer for one fit-test revision; each refreshes the given keys. */
export function useReviewActions(refreshKeys: () => string[]) {
  const refresh = () => refreshNuxtData(refreshKeys())
  return {
    async countersign(fitTestId: string, comment: string) {
      const done = await $fetch(`/api/fit-tests/${fitTestId}/countersign`, { method: 'POST', body: { comment } })
      await refresh()
      return done
    },
    async raiseQuery(fitTestId: string, question: string) {
      const done = await $fetch(`/api/fit-tests/${fitTestId}/queries`, { method: 'POST', body: { question } })
      await refresh()
      return done
    },
    async answerQuery(fitTestId: string, queryId: string, answer: string) {
      const done = await $fetch(`/api/fit-tests/${fitTestId}/queries/${queryId}/answer`, { method: 'POST', body: { answer } })
      await refresh()
      return done
    }
  }
}

/**
 * Countersign, query and answer for one fit-test revision. Call `refresh()` afterwards: a form in
 * the review queue tells its page first, since the refresh removes its row (and the form with it).
 */
export function useReviewActions(refreshKeys: () => string[]) {
  return {
    refresh: () => refreshNuxtData(refreshKeys()),
    countersign(fitTestId: string, comment: string) {
      return $fetch(`/api/fit-tests/${fitTestId}/countersign`, { method: 'POST', body: { comment } })
    },
    raiseQuery(fitTestId: string, question: string) {
      return $fetch(`/api/fit-tests/${fitTestId}/queries`, { method: 'POST', body: { question } })
    },
    answerQuery(fitTestId: string, queryId: string, answer: string) {
      return $fetch(`/api/fit-tests/${fitTestId}/queries/${queryId}/answer`, { method: 'POST', body: { answer } })
    }
  }
}

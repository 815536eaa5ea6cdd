/**
 * After a move to another page, keyboard and screen-reader users land on the new page's heading
 * (the route announcer reads the title out). The first load keeps the browser's own start, and a
 * change of query on the same page (a filter, the pager) leaves focus where the person is typing,
 * and focus the new page already placed itself (a started test's first field, a finished test's
 * verdict — see useFocusRequest) is left where it was put.
 */
export default defineNuxtPlugin((nuxtApp) => {
  const router = useRouter()
  let shownPath = router.currentRoute.value.path
  nuxtApp.hook('page:finish', () => {
    const path = router.currentRoute.value.path
    if (path === shownPath) return
    shownPath = path
    requestAnimationFrame(() => {
      const heading = document.querySelector<HTMLElement>('#main h1')
      if (!heading) return
      const active = document.activeElement
      if (active && active !== document.body && active !== heading && heading.closest('#main')?.contains(active)) return
      if (!heading.hasAttribute('tabindex')) heading.setAttribute('tabindex', '-1')
      heading.focus()
    })
  })
})

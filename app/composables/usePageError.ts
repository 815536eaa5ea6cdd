/**
 * A page whose own record cannot be read (missing, another organization's, not for this role)
 * becomes the app's error page with the read's status, rather than a page of blanks with a 200.
 */
export function failPageOn(error: Ref<unknown>) {
  const failure = error.value as { statusCode?: number } | null | undefined
  if (!failure) return
  const statusCode = failure.statusCode ?? 500
  throw createError({ statusCode, message: apiErrorOf(failure).message, fatal: true })
}

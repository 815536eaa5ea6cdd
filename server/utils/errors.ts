/**
 * The one way a route refuses a request. The sentence a person reads goes in `message`: h3 strips
 * non-ASCII from `statusMessage`, so "cm³" would arrive as "cm". Field messages go in
 * `data.fieldErrors`, beside the fields the form shows.
 */
export function httpError(statusCode: number, message: string, data?: Record<string, unknown>) {
  return createError({ statusCode, message, data })
}

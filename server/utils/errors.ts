/** The short HTTP reason each refusal carries; the sentence a person reads is in `message`. */
const REASONS: Record<number, string> = {
  400: 'Bad Request', 401: 'Unauthorized', 403: 'Forbidden', 404: 'Not Found', 409: 'Conflict',
  413: 'Payload Too Large', 422: 'Unprocessable Content', 429: 'Too Many Requests', 503: 'Service Unavailable'
}

/**
 * The one way a route refuses a request. The sentence a person reads goes in `message`: h3 strips
 * non-ASCII from `statusMessage`, so "cm³" would arrive as "cm". Field messages go in
 * `data.fieldErrors`, beside the fields the form shows.
 */
export function httpError(statusCode: number, message: string, data?: Record<string, unknown>) {
  return createError({ statusCode, statusMessage: REASONS[statusCode], message, data })
}

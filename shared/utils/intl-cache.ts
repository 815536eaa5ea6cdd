/**
 * Intl formatters, made once per locale and options. Building one reads locale and time-zone data
 * and costs far more than formatting with it, and a page formats hundreds of dates and numbers;
 * `Number#toLocaleString(locale, options)` builds a fresh formatter on every call.
 */
const dateFormats = new Map<string, Intl.DateTimeFormat>()
const numberFormats = new Map<string, Intl.NumberFormat>()

/** `new Intl.DateTimeFormat(locale, options)`, kept; throws as it would for an unknown time zone. */
export function dateTimeFormat(locale: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${JSON.stringify(options)}`
  let format = dateFormats.get(key)
  if (!format) {
    format = new Intl.DateTimeFormat(locale, options)
    dateFormats.set(key, format)
  }
  return format
}

/** `new Intl.NumberFormat(locale, options)`, kept. */
export function numberFormat(locale: string, options: Intl.NumberFormatOptions = {}): Intl.NumberFormat {
  const key = `${locale}|${JSON.stringify(options)}`
  let format = numberFormats.get(key)
  if (!format) {
    format = new Intl.NumberFormat(locale, options)
    numberFormats.set(key, format)
  }
  return format
}

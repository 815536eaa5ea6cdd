// Small, consistent console output for the start and test commands.
const useColour = process.stdout.isTTY && !process.env.NO_COLOR

const paint = (code, text) => (useColour ? `\x1b[${code}m${text}\x1b[0m` : text)

export const log = {
  step: text => console.log(`${paint('36', '›')} ${text}`),
  ok: text => console.log(`${paint('32', '✓')} ${text}`),
  warn: text => console.warn(`${paint('33', '!')} ${text}`),
  fail: text => console.error(`${paint('31', '✗')} ${text}`),
  plain: text => console.log(text),
  bold: text => paint('1', text)
}

/** Ends the command with a message that says what to do, never a stack trace. */
export function die(message, code = 1) {
  log.fail(message)
  process.exit(code)
}

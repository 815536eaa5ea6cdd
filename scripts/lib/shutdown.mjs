// One shutdown for `npm start` and `npm test`: what they started is stopped, newest first, on
// Ctrl-C, a kill signal, or when npm (or the shell it used) goes away without passing the signal on.
import { log } from './log.mjs'

/**
 * Returns `{ stops, stopAll, exitAfterStopping }`: push a stop function for each service started;
 * `stopAll()` stops them once (later calls wait for nothing); `exitAfterStopping(code)` stops and exits.
 */
export function shutdownOnExit({ signalCode = 0, onStopping = () => {}, onStopped = () => {} } = {}) {
  const stops = []
  let stopping = null

  async function stopAll() {
    if (stopping) return stopping
    stopping = (async () => {
      onStopping()
      for (const stop of stops.reverse()) {
        try {
          await stop()
        } catch (error) {
          log.warn(String(error?.message ?? error))
        }
      }
      stops.length = 0
      onStopped()
    })()
    return stopping
  }

  async function exitAfterStopping(code) {
    await stopAll()
    process.exit(code)
  }

  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => exitAfterStopping(signalCode))
  // Orphaned with PostgreSQL and the app still running would be worse than stopping: watch the parent.
  const parentAtStart = process.ppid
  setInterval(() => {
    if (process.ppid !== parentAtStart) exitAfterStopping(signalCode)
  }, 1000).unref()

  return { stops, stopAll, exitAfterStopping }
}

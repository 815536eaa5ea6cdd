// A counter's calibration state, apart from the equipment forms' zod schemas (equipment-schemas.ts)
// so the overview's badge does not load the schema library.

/** Calibration is warned this many days before its due date. */
export const CALIBRATION_WARNING_DAYS = 30

export type CalibrationState = 'ok' | 'due-soon' | 'past-due' | 'unknown'

/** Where a counter's calibration stands on a given calendar day (YYYY-MM-DD). Results after the due date are flagged. */
export function calibrationState(dueOn: string | null, today: string): { state: CalibrationState, daysLeft: number | null } {
  if (!dueOn) return { state: 'unknown', daysLeft: null }
  const daysLeft = Math.round((Date.parse(`${dueOn}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / 86_400_000)
  if (daysLeft < 0) return { state: 'past-due', daysLeft }
  if (daysLeft <= CALIBRATION_WARNING_DAYS) return { state: 'due-soon', daysLeft }
  return { state: 'ok', daysLeft }
}

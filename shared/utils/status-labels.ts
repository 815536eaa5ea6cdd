// What a person's fit status, medical clearance and due-list reasons are called on screen. Kept
// apart from the zod schemas that take these values (person-schemas.ts, oversight-schemas.ts) so a
// page that only shows a label does not load the schema library with it.
import type { MedicalClearanceStatus } from './enums'

export const MEDICAL_CLEARANCE_LABELS: Readonly<Record<MedicalClearanceStatus, string>> = {
  'cleared': 'Cleared',
  'cleared-with-limits': 'Cleared with limits',
  'pending': 'Awaiting evaluation',
  'not-cleared': 'Not cleared'
}

export const PERSON_STATUSES = ['current', 'due-soon', 'overdue', 'failed', 'never-tested'] as const
export type PersonFitStatus = typeof PERSON_STATUSES[number]
export const PERSON_STATUS_LABELS: Record<PersonFitStatus, string> = {
  'current': 'Current',
  'due-soon': 'Due within 30 days',
  'overdue': 'Overdue',
  'failed': 'Failed — retest needed',
  'never-tested': 'Never tested'
}

export const DUE_REASONS = ['overdue', 'due-soon', 'never-tested', 'failed', 'clearance-lapsed', 'clearance-lapsing', 'no-clearance'] as const
export const DUE_REASON_LABELS: Record<typeof DUE_REASONS[number], string> = {
  'overdue': 'Fit test overdue',
  'due-soon': 'Fit test due within 30 days',
  'never-tested': 'Assigned, never fit-tested',
  'failed': 'Last fit test failed',
  'clearance-lapsed': 'Medical clearance lapsed',
  'clearance-lapsing': 'Medical clearance ends within 30 days',
  'no-clearance': 'No medical clearance on file'
}

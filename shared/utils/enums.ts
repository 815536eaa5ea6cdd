// The values a record's state or kind may take, defined once. The database schema builds its
// column types and CHECK constraints from these arrays (server/database/schema/columns.ts
// `oneOf`), the zod schemas take them with `z.enum(...)`, and the pages type their choices with
// the types below. Arrays that belong to one area's form live beside its schema instead
// (MASK_UNIT_STATES, TEMPLATE_SCOPES, CHECK_STATUSES, ENTRY_MODES, ROLES) and are used the same way.

/** A fit-test revision: drafts are edited, finished ones are locked (see DEVELOPERS.md "Fit tests"). */
export const FIT_TEST_STATUSES = ['draft', 'finished', 'superseded', 'withdrawn', 'discarded'] as const
export type FitTestStatus = typeof FIT_TEST_STATUSES[number]

/** Quantitative (counts give a fit factor) or qualitative (the wearer's pass/fail response). */
export const FIT_TEST_KINDS = ['quantitative', 'qualitative'] as const
export type FitTestKind = typeof FIT_TEST_KINDS[number]

export const PRACTICE_TEST_STATUSES = ['draft', 'finished'] as const
export type PracticeTestStatus = typeof PRACTICE_TEST_STATUSES[number]

export const EXPOSURE_ASSESSMENT_STATUSES = ['draft', 'signed-off', 'superseded'] as const
export type ExposureAssessmentStatus = typeof EXPOSURE_ASSESSMENT_STATUSES[number]

export const MEDICAL_CLEARANCE_STATUSES = ['cleared', 'cleared-with-limits', 'pending', 'not-cleared'] as const
export type MedicalClearanceStatus = typeof MEDICAL_CLEARANCE_STATUSES[number]

export const REVIEW_QUERY_STATUSES = ['open', 'answered'] as const
export type ReviewQueryStatus = typeof REVIEW_QUERY_STATUSES[number]

/** The result of a fit test recorded before Sealwright (imported history). */
export const IMPORTED_RESULTS = ['pass', 'fail'] as const
export type ImportedResult = typeof IMPORTED_RESULTS[number]

/** A reminder to the wearer themself, or a summary to a tester or admin. */
export const REMINDER_KINDS = ['wearer', 'digest'] as const
export type ReminderKind = typeof REMINDER_KINDS[number]

export const REMINDER_TRIGGERS = ['scheduled', 'manual'] as const
export type ReminderTrigger = typeof REMINDER_TRIGGERS[number]

/** What a one-time link in an e-mail is for. */
export const TOKEN_PURPOSES = ['invitation', 'password-reset'] as const
export type TokenPurpose = typeof TOKEN_PURPOSES[number]

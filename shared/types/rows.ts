// Row types, read from the Drizzle schema (server/database/schema), never written by hand. A
// row as the database holds it; what a route sends is its own explicit object built from one.
// Type-only imports: nothing of the server reaches the browser bundle. (The fit-test row,
// FitTestRow, is still declared in server/utils/fit-tests.ts, which imports it by path.)
import type { InferSelectModel } from 'drizzle-orm'
import type * as schema from '../../server/database/schema'

export type OrganizationRow = InferSelectModel<typeof schema.organizations>
export type SiteRow = InferSelectModel<typeof schema.sites>
export type UserRow = InferSelectModel<typeof schema.users>
export type PersonRow = InferSelectModel<typeof schema.people>
export type CounterRow = InferSelectModel<typeof schema.counters>
export type BenchRigRow = InferSelectModel<typeof schema.benchRigs>
export type MaskTypeRow = InferSelectModel<typeof schema.maskTypes>
export type MaskUnitRow = InferSelectModel<typeof schema.maskUnits>
export type HeadformTestRow = InferSelectModel<typeof schema.headformTests>
export type ReadinessTemplateRow = InferSelectModel<typeof schema.readinessTemplates>
export type ReadinessCheckRow = InferSelectModel<typeof schema.readinessChecks>
export type RespiratorModelRow = InferSelectModel<typeof schema.respiratorModels>
export type FitCardRow = InferSelectModel<typeof schema.fitCards>
export type PracticeSetRow = InferSelectModel<typeof schema.practiceSets>
export type PracticePersonRow = InferSelectModel<typeof schema.practicePeople>
export type PracticeTestRow = InferSelectModel<typeof schema.practiceTests>
export type ExposureAssessmentRow = InferSelectModel<typeof schema.exposureAssessments>
export type MedicalClearanceRow = InferSelectModel<typeof schema.medicalClearances>
export type ReviewQueryRow = InferSelectModel<typeof schema.reviewQueries>

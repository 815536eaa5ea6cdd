import { describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { objectsFromJson, rowsFromJson } from '../../server/utils/json-rows'

// Rows read back from JSON built in PostgreSQL (the person page's single query) must read exactly
// as a `select` of the same columns would: these are the shapes PostgreSQL 15 gives for each type.
describe('rows aggregated as JSON in one query', () => {
  it('decode a whole row from to_jsonb: snake_case keys, timestamps with microseconds, dates kept as text', () => {
    const [row] = rowsFromJson(schema.fitHistoryEntries, [{
      id: 'a', organization_id: 'o', person_id: 'p', tested_on: '2025-03-04', respirator_model_id: null, respirator_make: 'Make',
      respirator_model: 'Model', respirator_class: 'elastomeric-half-mask', respirator_size: 'M', passed: 'pass', overall_fit_factor: 123.5,
      tester_name: null, due_on: '2026-03-04', import_key: 'k', imported_by_user_id: null, created_at: '2026-12-02T08:18:46.123456+00:00'
    }])
    expect(row).toEqual({
      id: 'a', organizationId: 'o', personId: 'p', testedOn: '2025-03-04', respiratorModelId: null, respiratorMake: 'Make',
      respiratorModel: 'Model', respiratorClass: 'elastomeric-half-mask', respiratorSize: 'M', passed: 'pass', overallFitFactor: 123.5,
      testerName: null, dueOn: '2026-03-04', importKey: 'k', importedByUserId: null, createdAt: new Date('2026-12-02T08:18:46.123Z')
    })
  })

  it('parse jsonb columns and keep a missing key as null', () => {
    const [row] = rowsFromJson(schema.medicalClearances, [{ id: 'c', respirator_classes: ['elastomeric-half-mask'], cleared_on: '2026-01-15' }])
    expect(row!.respiratorClasses).toEqual(['elastomeric-half-mask'])
    expect(row!.validUntil).toBeNull()
    expect(row!.clearedOn).toBe('2026-01-15')
  })

  it('decode named columns from json_build_object by their own decoders', () => {
    const fields = { id: schema.fitTests.id, performedAt: schema.fitTests.performedAt, dueOn: schema.fitTests.dueOn, siteName: schema.sites.name }
    const [row] = objectsFromJson(fields, [{ id: 't', performedAt: '2026-11-20T15:00:00+00:00', dueOn: null, siteName: 'North' }])
    expect(row).toEqual({ id: 't', performedAt: new Date('2026-11-20T15:00:00Z'), dueOn: null, siteName: 'North' })
  })
})

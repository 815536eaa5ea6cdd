ALTER TABLE "auth_tokens" ADD CONSTRAINT "auth_tokens_purpose_check" CHECK ("auth_tokens"."purpose" in ('invitation', 'password-reset'));--> statement-breakpoint
ALTER TABLE "mask_unit_events" ADD CONSTRAINT "mask_unit_events_from_state_check" CHECK ("mask_unit_events"."from_state" in ('in-service', 'held', 'retired'));--> statement-breakpoint
ALTER TABLE "mask_unit_events" ADD CONSTRAINT "mask_unit_events_to_state_check" CHECK ("mask_unit_events"."to_state" in ('in-service', 'held', 'retired'));--> statement-breakpoint
ALTER TABLE "mask_units" ADD CONSTRAINT "mask_units_state_check" CHECK ("mask_units"."state" in ('in-service', 'held', 'retired'));--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_status_check" CHECK ("readiness_checks"."status" in ('in-progress', 'passed', 'failed', 'abandoned'));--> statement-breakpoint
ALTER TABLE "readiness_templates" ADD CONSTRAINT "readiness_templates_scope_check" CHECK ("readiness_templates"."scope" in ('counter', 'bench-rig'));--> statement-breakpoint
ALTER TABLE "people" ADD CONSTRAINT "people_medical_clearance_status_check" CHECK ("people"."medical_clearance_status" in ('cleared', 'cleared-with-limits', 'pending', 'not-cleared'));--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_status_check" CHECK ("fit_tests"."status" in ('draft', 'finished', 'superseded', 'withdrawn', 'discarded'));--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_kind_check" CHECK ("fit_tests"."kind" in ('quantitative', 'qualitative'));--> statement-breakpoint
ALTER TABLE "practice_tests" ADD CONSTRAINT "practice_tests_status_check" CHECK ("practice_tests"."status" in ('draft', 'finished'));--> statement-breakpoint
ALTER TABLE "review_queries" ADD CONSTRAINT "review_queries_status_check" CHECK ("review_queries"."status" in ('open', 'answered'));--> statement-breakpoint
ALTER TABLE "exposure_assessments" ADD CONSTRAINT "exposure_assessments_status_check" CHECK ("exposure_assessments"."status" in ('draft', 'signed-off', 'superseded'));--> statement-breakpoint
ALTER TABLE "fit_history_entries" ADD CONSTRAINT "fit_history_entries_passed_check" CHECK ("fit_history_entries"."passed" in ('pass', 'fail'));--> statement-breakpoint
ALTER TABLE "reminder_log" ADD CONSTRAINT "reminder_log_kind_check" CHECK ("reminder_log"."kind" in ('wearer', 'digest'));--> statement-breakpoint
ALTER TABLE "reminder_log" ADD CONSTRAINT "reminder_log_trigger_check" CHECK ("reminder_log"."trigger" in ('scheduled', 'manual'));
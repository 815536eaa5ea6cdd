DROP INDEX "fit_cards_record_unique";--> statement-breakpoint
ALTER TABLE "headform_tests" ADD COLUMN "passed" boolean;--> statement-breakpoint
ALTER TABLE "mask_unit_events" ADD COLUMN "override" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "fit_cards" ADD COLUMN "fit_test_id" uuid;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD COLUMN "mask_unit_id" uuid;--> statement-breakpoint
ALTER TABLE "fit_cards" ADD CONSTRAINT "fit_cards_fit_test_id_fit_tests_id_fk" FOREIGN KEY ("fit_test_id") REFERENCES "public"."fit_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_mask_unit_id_mask_units_id_fk" FOREIGN KEY ("mask_unit_id") REFERENCES "public"."mask_units"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "fit_cards_record_idx" ON "fit_cards" USING btree ("record_id");--> statement-breakpoint
CREATE UNIQUE INDEX "fit_cards_fit_test_unique" ON "fit_cards" USING btree ("fit_test_id");
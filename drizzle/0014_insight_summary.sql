CREATE TABLE "insight_drift" (
	"organization_id" uuid NOT NULL,
	"person_id" uuid NOT NULL,
	"respirator_model_id" uuid NOT NULL,
	"latest_fit_test_id" uuid NOT NULL,
	"tests" integer NOT NULL,
	"slope_per_year" double precision NOT NULL,
	"latest_ln_fit_factor" double precision NOT NULL,
	"median_ln_fit_factor" double precision NOT NULL,
	"predicted_at_due" double precision NOT NULL,
	"next_due_on" date NOT NULL,
	"pass_level" double precision,
	"below_median" boolean NOT NULL,
	"predicts_fail" boolean NOT NULL,
	"series" double precision[] NOT NULL,
	"dates" text[] NOT NULL,
	CONSTRAINT "insight_drift_organization_id_person_id_respirator_model_id_pk" PRIMARY KEY("organization_id","person_id","respirator_model_id")
);
--> statement-breakpoint
CREATE TABLE "insight_results" (
	"fit_test_id" uuid PRIMARY KEY NOT NULL,
	"organization_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"person_id" uuid NOT NULL,
	"tester_user_id" uuid NOT NULL,
	"counter_id" uuid,
	"respirator_model_id" uuid NOT NULL,
	"respirator_make" text NOT NULL,
	"respirator_model" text NOT NULL,
	"respirator_size" text NOT NULL,
	"protocol_key" text NOT NULL,
	"performed_at" timestamp with time zone NOT NULL,
	"time_zone" text NOT NULL,
	"local_day" date NOT NULL,
	"passed" boolean NOT NULL,
	"ln_fit_factor" double precision,
	"overall_is_lower_bound" boolean,
	"pass_level" double precision,
	"due_on" date,
	"first_attempt" boolean NOT NULL,
	"last_check_at" timestamp with time zone,
	"last_check_passed" boolean,
	"last_check_local_day" date,
	"limiting_movement" text,
	"movement_shares" double precision[],
	"other_shares" jsonb
);
--> statement-breakpoint
ALTER TABLE "insight_drift" ADD CONSTRAINT "insight_drift_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insight_drift" ADD CONSTRAINT "insight_drift_latest_fit_test_id_fit_tests_id_fk" FOREIGN KEY ("latest_fit_test_id") REFERENCES "public"."fit_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insight_results" ADD CONSTRAINT "insight_results_fit_test_id_fit_tests_id_fk" FOREIGN KEY ("fit_test_id") REFERENCES "public"."fit_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insight_results" ADD CONSTRAINT "insight_results_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "insight_drift_flagged_idx" ON "insight_drift" USING btree ("organization_id","slope_per_year") WHERE below_median or predicts_fail;--> statement-breakpoint
CREATE INDEX "insight_results_organization_performed_idx" ON "insight_results" USING btree ("organization_id","performed_at");--> statement-breakpoint
CREATE INDEX "insight_results_organization_model_idx" ON "insight_results" USING btree ("organization_id","respirator_model_id","performed_at");--> statement-breakpoint
CREATE INDEX "insight_results_person_model_idx" ON "insight_results" USING btree ("organization_id","person_id","respirator_model_id","performed_at");
CREATE TABLE "people" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"site_id" uuid,
	"user_id" uuid,
	"full_name" text NOT NULL,
	"employee_number" text,
	"job_title" text,
	"email" text,
	"medical_clearance_on" date,
	"medical_clearance_status" text DEFAULT 'pending' NOT NULL,
	"notes" text,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "fit_cards" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"record_id" uuid NOT NULL,
	"token" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "fit_tests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"record_id" uuid NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"revision_reason" text,
	"status" text DEFAULT 'draft' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"idempotency_key" text,
	"person_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"tester_user_id" uuid NOT NULL,
	"counter_id" uuid,
	"respirator_model_id" uuid NOT NULL,
	"respirator_make" text NOT NULL,
	"respirator_model" text NOT NULL,
	"respirator_class" text NOT NULL,
	"respirator_size" text NOT NULL,
	"kind" text DEFAULT 'quantitative' NOT NULL,
	"protocol_key" text NOT NULL,
	"protocol" jsonb,
	"sample_flow_cm3_per_min" double precision,
	"performed_at" timestamp with time zone NOT NULL,
	"pre_test" jsonb NOT NULL,
	"entry" jsonb NOT NULL,
	"series_text" text,
	"series_sha256" text,
	"pass_level" double precision,
	"overall_fit_factor" double precision,
	"overall_is_lower_bound" boolean,
	"passed" boolean,
	"limiting_exercise_key" text,
	"due_on" date,
	"finished_at" timestamp with time zone,
	"finished_by_user_id" uuid,
	"withdrawn_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "people" ADD CONSTRAINT "people_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "people" ADD CONSTRAINT "people_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "people" ADD CONSTRAINT "people_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_cards" ADD CONSTRAINT "fit_cards_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_tester_user_id_users_id_fk" FOREIGN KEY ("tester_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_counter_id_counters_id_fk" FOREIGN KEY ("counter_id") REFERENCES "public"."counters"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_respirator_model_id_respirator_models_id_fk" FOREIGN KEY ("respirator_model_id") REFERENCES "public"."respirator_models"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD CONSTRAINT "fit_tests_finished_by_user_id_users_id_fk" FOREIGN KEY ("finished_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "people_organization_idx" ON "people" USING btree ("organization_id");--> statement-breakpoint
CREATE UNIQUE INDEX "people_employee_number_unique" ON "people" USING btree ("organization_id","employee_number");--> statement-breakpoint
CREATE INDEX "people_user_idx" ON "people" USING btree ("user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "fit_cards_token_unique" ON "fit_cards" USING btree ("token");--> statement-breakpoint
CREATE UNIQUE INDEX "fit_cards_record_unique" ON "fit_cards" USING btree ("record_id");--> statement-breakpoint
CREATE INDEX "fit_tests_organization_performed_idx" ON "fit_tests" USING btree ("organization_id","performed_at");--> statement-breakpoint
CREATE INDEX "fit_tests_person_idx" ON "fit_tests" USING btree ("person_id");--> statement-breakpoint
CREATE INDEX "fit_tests_record_idx" ON "fit_tests" USING btree ("record_id");--> statement-breakpoint
CREATE UNIQUE INDEX "fit_tests_record_revision_unique" ON "fit_tests" USING btree ("record_id","revision");--> statement-breakpoint
CREATE UNIQUE INDEX "fit_tests_idempotency_unique" ON "fit_tests" USING btree ("organization_id","idempotency_key");
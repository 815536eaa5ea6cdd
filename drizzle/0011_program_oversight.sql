CREATE TABLE "fit_history_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"person_id" uuid NOT NULL,
	"tested_on" date NOT NULL,
	"respirator_model_id" uuid,
	"respirator_make" text NOT NULL,
	"respirator_model" text NOT NULL,
	"respirator_class" text NOT NULL,
	"respirator_size" text NOT NULL,
	"passed" text NOT NULL,
	"overall_fit_factor" double precision,
	"tester_name" text,
	"due_on" date,
	"import_key" text NOT NULL,
	"imported_by_user_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "medical_clearances" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"person_id" uuid NOT NULL,
	"cleared_on" date NOT NULL,
	"valid_until" date,
	"cleared_by" text NOT NULL,
	"respirator_classes" jsonb NOT NULL,
	"restrictions" text,
	"import_key" text,
	"recorded_by_user_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reminder_log" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"person_id" uuid,
	"due_item" text NOT NULL,
	"due_on" date NOT NULL,
	"step" text NOT NULL,
	"recipient" text NOT NULL,
	"kind" text NOT NULL,
	"trigger" text NOT NULL,
	"sent_by_user_id" uuid,
	"sent_at" timestamp with time zone,
	"error" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "respirator_assignments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"person_id" uuid NOT NULL,
	"respirator_model_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "people" ADD COLUMN "reminder_opt_out" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD COLUMN "discarded_reason" text;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD COLUMN "retest_of_record_id" uuid;--> statement-breakpoint
ALTER TABLE "fit_tests" ADD COLUMN "clearance_at_start" jsonb;--> statement-breakpoint
ALTER TABLE "fit_history_entries" ADD CONSTRAINT "fit_history_entries_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_history_entries" ADD CONSTRAINT "fit_history_entries_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_history_entries" ADD CONSTRAINT "fit_history_entries_respirator_model_id_respirator_models_id_fk" FOREIGN KEY ("respirator_model_id") REFERENCES "public"."respirator_models"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_history_entries" ADD CONSTRAINT "fit_history_entries_imported_by_user_id_users_id_fk" FOREIGN KEY ("imported_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "medical_clearances" ADD CONSTRAINT "medical_clearances_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "medical_clearances" ADD CONSTRAINT "medical_clearances_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "medical_clearances" ADD CONSTRAINT "medical_clearances_recorded_by_user_id_users_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reminder_log" ADD CONSTRAINT "reminder_log_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reminder_log" ADD CONSTRAINT "reminder_log_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reminder_log" ADD CONSTRAINT "reminder_log_sent_by_user_id_users_id_fk" FOREIGN KEY ("sent_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "respirator_assignments" ADD CONSTRAINT "respirator_assignments_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "respirator_assignments" ADD CONSTRAINT "respirator_assignments_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "respirator_assignments" ADD CONSTRAINT "respirator_assignments_respirator_model_id_respirator_models_id_fk" FOREIGN KEY ("respirator_model_id") REFERENCES "public"."respirator_models"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "fit_history_person_idx" ON "fit_history_entries" USING btree ("organization_id","person_id");--> statement-breakpoint
CREATE UNIQUE INDEX "fit_history_import_unique" ON "fit_history_entries" USING btree ("organization_id","import_key");--> statement-breakpoint
CREATE INDEX "medical_clearances_person_idx" ON "medical_clearances" USING btree ("organization_id","person_id");--> statement-breakpoint
CREATE UNIQUE INDEX "medical_clearances_import_unique" ON "medical_clearances" USING btree ("organization_id","import_key");--> statement-breakpoint
CREATE INDEX "reminder_log_person_idx" ON "reminder_log" USING btree ("organization_id","person_id");--> statement-breakpoint
CREATE UNIQUE INDEX "reminder_log_step_unique" ON "reminder_log" USING btree ("organization_id","person_id","due_item","due_on","step","recipient") WHERE trigger = 'scheduled';--> statement-breakpoint
CREATE UNIQUE INDEX "reminder_log_digest_unique" ON "reminder_log" USING btree ("organization_id","due_item","due_on","step","recipient") WHERE trigger = 'scheduled' and person_id is null;--> statement-breakpoint
CREATE UNIQUE INDEX "respirator_assignments_unique" ON "respirator_assignments" USING btree ("person_id","respirator_model_id");
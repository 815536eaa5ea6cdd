CREATE TABLE "bench_rigs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"site_id" uuid,
	"serial_number" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"counter_id" uuid NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "headform_tests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"mask_unit_id" uuid NOT NULL,
	"bench_rig_id" uuid NOT NULL,
	"counter_id" uuid NOT NULL,
	"site_id" uuid,
	"performed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"performed_by" uuid,
	"outside" double precision NOT NULL,
	"inside" double precision NOT NULL,
	"sample_seconds" double precision NOT NULL,
	"sample_flow_cm3_per_min" double precision NOT NULL,
	"pass_level" double precision NOT NULL,
	"pass_level_is_default" boolean NOT NULL,
	"sub_checks" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mask_types" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"name" text NOT NULL,
	"has_drink_tube" boolean DEFAULT false NOT NULL,
	"has_exhalation_valve" boolean DEFAULT false NOT NULL,
	"headform_pass_level" double precision,
	"headform_retest_days" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mask_unit_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"mask_unit_id" uuid NOT NULL,
	"from_state" text,
	"to_state" text NOT NULL,
	"reason" text NOT NULL,
	"headform_test_id" uuid,
	"actor_user_id" uuid,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mask_units" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"serial_number" text NOT NULL,
	"respirator_model_id" uuid NOT NULL,
	"mask_type_id" uuid NOT NULL,
	"size" text NOT NULL,
	"site_id" uuid,
	"state" text DEFAULT 'in-service' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "readiness_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"template_id" uuid,
	"template_name" text NOT NULL,
	"counter_id" uuid NOT NULL,
	"bench_rig_id" uuid,
	"site_id" uuid,
	"mask_type_id" uuid,
	"steps" jsonb NOT NULL,
	"skipped_steps" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"entries" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"current_step" integer DEFAULT 0 NOT NULL,
	"status" text DEFAULT 'in-progress' NOT NULL,
	"abandon_reason" text,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"completed_at" timestamp with time zone,
	"performed_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "readiness_templates" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"name" text NOT NULL,
	"scope" text NOT NULL,
	"steps" jsonb NOT NULL,
	"is_default" boolean DEFAULT false NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "bench_rigs" ADD CONSTRAINT "bench_rigs_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_rigs" ADD CONSTRAINT "bench_rigs_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_rigs" ADD CONSTRAINT "bench_rigs_counter_id_counters_id_fk" FOREIGN KEY ("counter_id") REFERENCES "public"."counters"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "headform_tests" ADD CONSTRAINT "headform_tests_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "headform_tests" ADD CONSTRAINT "headform_tests_mask_unit_id_mask_units_id_fk" FOREIGN KEY ("mask_unit_id") REFERENCES "public"."mask_units"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "headform_tests" ADD CONSTRAINT "headform_tests_bench_rig_id_bench_rigs_id_fk" FOREIGN KEY ("bench_rig_id") REFERENCES "public"."bench_rigs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "headform_tests" ADD CONSTRAINT "headform_tests_counter_id_counters_id_fk" FOREIGN KEY ("counter_id") REFERENCES "public"."counters"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "headform_tests" ADD CONSTRAINT "headform_tests_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "headform_tests" ADD CONSTRAINT "headform_tests_performed_by_users_id_fk" FOREIGN KEY ("performed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_types" ADD CONSTRAINT "mask_types_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_unit_events" ADD CONSTRAINT "mask_unit_events_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_unit_events" ADD CONSTRAINT "mask_unit_events_mask_unit_id_mask_units_id_fk" FOREIGN KEY ("mask_unit_id") REFERENCES "public"."mask_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_unit_events" ADD CONSTRAINT "mask_unit_events_actor_user_id_users_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_units" ADD CONSTRAINT "mask_units_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_units" ADD CONSTRAINT "mask_units_respirator_model_id_respirator_models_id_fk" FOREIGN KEY ("respirator_model_id") REFERENCES "public"."respirator_models"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_units" ADD CONSTRAINT "mask_units_mask_type_id_mask_types_id_fk" FOREIGN KEY ("mask_type_id") REFERENCES "public"."mask_types"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mask_units" ADD CONSTRAINT "mask_units_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_template_id_readiness_templates_id_fk" FOREIGN KEY ("template_id") REFERENCES "public"."readiness_templates"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_counter_id_counters_id_fk" FOREIGN KEY ("counter_id") REFERENCES "public"."counters"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_bench_rig_id_bench_rigs_id_fk" FOREIGN KEY ("bench_rig_id") REFERENCES "public"."bench_rigs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_mask_type_id_mask_types_id_fk" FOREIGN KEY ("mask_type_id") REFERENCES "public"."mask_types"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_checks" ADD CONSTRAINT "readiness_checks_performed_by_users_id_fk" FOREIGN KEY ("performed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readiness_templates" ADD CONSTRAINT "readiness_templates_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "bench_rigs_organization_idx" ON "bench_rigs" USING btree ("organization_id");--> statement-breakpoint
CREATE UNIQUE INDEX "bench_rigs_serial_unique" ON "bench_rigs" USING btree ("organization_id","serial_number");--> statement-breakpoint
CREATE INDEX "headform_tests_unit_idx" ON "headform_tests" USING btree ("mask_unit_id","performed_at");--> statement-breakpoint
CREATE INDEX "headform_tests_organization_idx" ON "headform_tests" USING btree ("organization_id","performed_at");--> statement-breakpoint
CREATE UNIQUE INDEX "mask_types_organization_name_unique" ON "mask_types" USING btree ("organization_id","name");--> statement-breakpoint
CREATE INDEX "mask_unit_events_unit_idx" ON "mask_unit_events" USING btree ("mask_unit_id","at");--> statement-breakpoint
CREATE INDEX "mask_units_organization_idx" ON "mask_units" USING btree ("organization_id");--> statement-breakpoint
CREATE UNIQUE INDEX "mask_units_serial_unique" ON "mask_units" USING btree ("organization_id","serial_number");--> statement-breakpoint
CREATE INDEX "readiness_checks_organization_completed_idx" ON "readiness_checks" USING btree ("organization_id","completed_at");--> statement-breakpoint
CREATE INDEX "readiness_checks_counter_idx" ON "readiness_checks" USING btree ("counter_id");--> statement-breakpoint
CREATE INDEX "readiness_templates_organization_idx" ON "readiness_templates" USING btree ("organization_id");
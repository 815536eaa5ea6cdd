CREATE TABLE "practice_people" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"practice_set_id" uuid NOT NULL,
	"full_name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "practice_sets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"name" text NOT NULL,
	"created_by_user_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "practice_tests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"practice_set_id" uuid NOT NULL,
	"practice_person_id" uuid NOT NULL,
	"trainee_user_id" uuid NOT NULL,
	"idempotency_key" text,
	"status" text DEFAULT 'draft' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"respirator_class" text NOT NULL,
	"protocol_key" text NOT NULL,
	"protocol" jsonb NOT NULL,
	"sample_flow_cm3_per_min" double precision,
	"entry" jsonb NOT NULL,
	"series_text" text,
	"pass_level" double precision NOT NULL,
	"overall_fit_factor" double precision,
	"overall_is_lower_bound" boolean,
	"passed" boolean,
	"finished_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "practice_people" ADD CONSTRAINT "practice_people_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_people" ADD CONSTRAINT "practice_people_practice_set_id_practice_sets_id_fk" FOREIGN KEY ("practice_set_id") REFERENCES "public"."practice_sets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_sets" ADD CONSTRAINT "practice_sets_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_sets" ADD CONSTRAINT "practice_sets_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_tests" ADD CONSTRAINT "practice_tests_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_tests" ADD CONSTRAINT "practice_tests_practice_set_id_practice_sets_id_fk" FOREIGN KEY ("practice_set_id") REFERENCES "public"."practice_sets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_tests" ADD CONSTRAINT "practice_tests_practice_person_id_practice_people_id_fk" FOREIGN KEY ("practice_person_id") REFERENCES "public"."practice_people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_tests" ADD CONSTRAINT "practice_tests_trainee_user_id_users_id_fk" FOREIGN KEY ("trainee_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "practice_people_set_idx" ON "practice_people" USING btree ("practice_set_id");--> statement-breakpoint
CREATE INDEX "practice_sets_organization_idx" ON "practice_sets" USING btree ("organization_id");--> statement-breakpoint
CREATE INDEX "practice_tests_set_idx" ON "practice_tests" USING btree ("practice_set_id");--> statement-breakpoint
CREATE UNIQUE INDEX "practice_tests_idempotency_unique" ON "practice_tests" USING btree ("organization_id","idempotency_key");
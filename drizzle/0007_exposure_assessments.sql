CREATE TABLE "exposure_assessments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"record_id" uuid NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"revision_reason" text,
	"status" text DEFAULT 'draft' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"title" text NOT NULL,
	"site_id" uuid,
	"rule_set" text NOT NULL,
	"input" jsonb NOT NULL,
	"chosen_class_keys" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"rationale" text DEFAULT '' NOT NULL,
	"required_protection_factor" double precision NOT NULL,
	"idlh_atmosphere" boolean DEFAULT false NOT NULL,
	"created_by_user_id" uuid NOT NULL,
	"signed_off_by_user_id" uuid,
	"signed_off_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "exposure_assignments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"record_id" uuid NOT NULL,
	"person_id" uuid,
	"job_title" text,
	"created_by_user_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "exposure_assessments" ADD CONSTRAINT "exposure_assessments_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_assessments" ADD CONSTRAINT "exposure_assessments_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_assessments" ADD CONSTRAINT "exposure_assessments_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_assessments" ADD CONSTRAINT "exposure_assessments_signed_off_by_user_id_users_id_fk" FOREIGN KEY ("signed_off_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_assignments" ADD CONSTRAINT "exposure_assignments_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_assignments" ADD CONSTRAINT "exposure_assignments_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_assignments" ADD CONSTRAINT "exposure_assignments_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "exposure_assessments_organization_idx" ON "exposure_assessments" USING btree ("organization_id");--> statement-breakpoint
CREATE INDEX "exposure_assessments_record_idx" ON "exposure_assessments" USING btree ("record_id");--> statement-breakpoint
CREATE UNIQUE INDEX "exposure_assessments_record_revision_unique" ON "exposure_assessments" USING btree ("record_id","revision");--> statement-breakpoint
CREATE INDEX "exposure_assignments_record_idx" ON "exposure_assignments" USING btree ("organization_id","record_id");--> statement-breakpoint
CREATE UNIQUE INDEX "exposure_assignments_person_unique" ON "exposure_assignments" USING btree ("record_id","person_id");--> statement-breakpoint
CREATE UNIQUE INDEX "exposure_assignments_job_unique" ON "exposure_assignments" USING btree ("record_id","job_title");
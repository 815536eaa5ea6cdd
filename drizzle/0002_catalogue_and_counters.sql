CREATE TABLE "respirator_models" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"make" text NOT NULL,
	"model" text NOT NULL,
	"respirator_class" text NOT NULL,
	"sizes" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"notes" text,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "counters" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"site_id" uuid,
	"serial_number" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"sample_flow_cm3_per_min" double precision NOT NULL,
	"calibration_due_on" date,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "respirator_models" ADD CONSTRAINT "respirator_models_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "counters" ADD CONSTRAINT "counters_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "counters" ADD CONSTRAINT "counters_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "respirator_models_organization_idx" ON "respirator_models" USING btree ("organization_id");--> statement-breakpoint
CREATE UNIQUE INDEX "respirator_models_make_model_unique" ON "respirator_models" USING btree ("organization_id","make","model");--> statement-breakpoint
CREATE INDEX "counters_organization_idx" ON "counters" USING btree ("organization_id");--> statement-breakpoint
CREATE UNIQUE INDEX "counters_serial_unique" ON "counters" USING btree ("organization_id","serial_number");
CREATE TABLE "countersigns" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"fit_test_id" uuid NOT NULL,
	"record_id" uuid NOT NULL,
	"signed_by_user_id" uuid NOT NULL,
	"comment" text,
	"signed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "fit_test_exercise_results" (
	"fit_test_id" uuid NOT NULL,
	"organization_id" uuid NOT NULL,
	"exercise_key" text NOT NULL,
	"movement" text NOT NULL,
	"fit_factor" double precision NOT NULL,
	"is_lower_bound" boolean NOT NULL,
	"penetration_share" double precision NOT NULL,
	"is_limiting" boolean NOT NULL,
	CONSTRAINT "fit_test_exercise_results_fit_test_id_exercise_key_pk" PRIMARY KEY("fit_test_id","exercise_key")
);
--> statement-breakpoint
CREATE TABLE "review_queries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"fit_test_id" uuid NOT NULL,
	"record_id" uuid NOT NULL,
	"raised_by_user_id" uuid NOT NULL,
	"question" text NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"answer" text,
	"answered_by_user_id" uuid,
	"answered_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "countersigns" ADD CONSTRAINT "countersigns_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "countersigns" ADD CONSTRAINT "countersigns_fit_test_id_fit_tests_id_fk" FOREIGN KEY ("fit_test_id") REFERENCES "public"."fit_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "countersigns" ADD CONSTRAINT "countersigns_signed_by_user_id_users_id_fk" FOREIGN KEY ("signed_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_test_exercise_results" ADD CONSTRAINT "fit_test_exercise_results_fit_test_id_fit_tests_id_fk" FOREIGN KEY ("fit_test_id") REFERENCES "public"."fit_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_test_exercise_results" ADD CONSTRAINT "fit_test_exercise_results_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_queries" ADD CONSTRAINT "review_queries_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_queries" ADD CONSTRAINT "review_queries_fit_test_id_fit_tests_id_fk" FOREIGN KEY ("fit_test_id") REFERENCES "public"."fit_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_queries" ADD CONSTRAINT "review_queries_raised_by_user_id_users_id_fk" FOREIGN KEY ("raised_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_queries" ADD CONSTRAINT "review_queries_answered_by_user_id_users_id_fk" FOREIGN KEY ("answered_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "countersigns_fit_test_unique" ON "countersigns" USING btree ("fit_test_id");--> statement-breakpoint
CREATE INDEX "countersigns_organization_idx" ON "countersigns" USING btree ("organization_id");--> statement-breakpoint
CREATE INDEX "fit_test_exercise_results_organization_idx" ON "fit_test_exercise_results" USING btree ("organization_id");--> statement-breakpoint
CREATE INDEX "review_queries_fit_test_idx" ON "review_queries" USING btree ("fit_test_id");--> statement-breakpoint
CREATE INDEX "review_queries_organization_status_idx" ON "review_queries" USING btree ("organization_id","status");
ALTER TABLE "insight_results" ADD COLUMN "share_normal_breathing" double precision;--> statement-breakpoint
ALTER TABLE "insight_results" ADD COLUMN "share_deep_breathing" double precision;--> statement-breakpoint
ALTER TABLE "insight_results" ADD COLUMN "share_head_side_to_side" double precision;--> statement-breakpoint
ALTER TABLE "insight_results" ADD COLUMN "share_head_up_and_down" double precision;--> statement-breakpoint
ALTER TABLE "insight_results" ADD COLUMN "share_talking" double precision;--> statement-breakpoint
ALTER TABLE "insight_results" ADD COLUMN "share_grimace" double precision;--> statement-breakpoint
ALTER TABLE "insight_results" ADD COLUMN "share_bending" double precision;--> statement-breakpoint
ALTER TABLE "insight_results" ADD COLUMN "share_jogging" double precision;--> statement-breakpoint
CREATE INDEX "insight_results_site_zone_idx" ON "insight_results" USING btree ("organization_id","site_id","time_zone");--> statement-breakpoint
ALTER TABLE "insight_results" DROP COLUMN "movement_shares";
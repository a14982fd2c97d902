ALTER TABLE "sites" ADD COLUMN "plan_image_screen_ref" text;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "plan_image_width_px" integer;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "plan_image_height_px" integer;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "plan_image_content_type" text;--> statement-breakpoint
-- Before this migration plan_image_ref was free text set through PATCH, never an uploaded file: such
-- references (and the calibrations made against them) point at nothing and are cleared.
UPDATE "sites" SET "plan_image_ref" = NULL, "plan_cal_a_x" = NULL, "plan_cal_a_y" = NULL, "plan_cal_b_x" = NULL, "plan_cal_b_y" = NULL, "plan_cal_distance_m" = NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_plan_image_complete" CHECK (("sites"."plan_image_ref" is null) = ("sites"."plan_image_screen_ref" is null) and ("sites"."plan_image_ref" is null) = ("sites"."plan_image_width_px" is null)
        and ("sites"."plan_image_ref" is null) = ("sites"."plan_image_height_px" is null) and ("sites"."plan_image_ref" is null) = ("sites"."plan_image_content_type" is null));--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_plan_calibration_needs_image" CHECK ("sites"."plan_cal_distance_m" is null or "sites"."plan_image_ref" is not null);
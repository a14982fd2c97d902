CREATE TYPE "public"."photo_variant" AS ENUM('thumb', 'screen', 'print');--> statement-breakpoint
CREATE TABLE "photo_derivatives" (
	"photo_id" uuid NOT NULL,
	"variant" "photo_variant" NOT NULL,
	"key" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" integer NOT NULL,
	"content_type" text NOT NULL,
	CONSTRAINT "photo_derivatives_photo_id_variant_pk" PRIMARY KEY("photo_id","variant"),
	CONSTRAINT "photo_derivatives_size_positive" CHECK ("photo_derivatives"."width" > 0 and "photo_derivatives"."height" > 0 and "photo_derivatives"."bytes" > 0)
);
--> statement-breakpoint
CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY NOT NULL,
	"company_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"item_id" uuid,
	"run_id" uuid,
	"depth_reading_id" uuid,
	"caption" text,
	"client_taken_at" timestamp with time zone,
	"exif_taken_at" timestamp,
	"gps_lat" double precision,
	"gps_lon" double precision,
	"original_key" text NOT NULL,
	"original_content_type" text NOT NULL,
	"original_bytes" integer NOT NULL,
	"original_name" text,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"sha256" text NOT NULL,
	"uploaded_by_user_id" uuid,
	"client_upload_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	CONSTRAINT "photos_job_id_client_upload_id_key" UNIQUE("job_id","client_upload_id"),
	CONSTRAINT "photos_one_target" CHECK (num_nonnulls("photos"."item_id", "photos"."run_id", "photos"."depth_reading_id") <= 1),
	CONSTRAINT "photos_gps_pair" CHECK (("photos"."gps_lat" is null) = ("photos"."gps_lon" is null)),
	CONSTRAINT "photos_gps_range" CHECK ("photos"."gps_lat" is null or ("photos"."gps_lat" between -90 and 90 and "photos"."gps_lon" between -180 and 180)),
	CONSTRAINT "photos_size_positive" CHECK ("photos"."width" > 0 and "photos"."height" > 0 and "photos"."original_bytes" >= 0),
	CONSTRAINT "photos_sha256_hex" CHECK ("photos"."sha256" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
ALTER TABLE "photo_derivatives" ADD CONSTRAINT "photo_derivatives_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_item_id_items_id_fk" FOREIGN KEY ("item_id") REFERENCES "public"."items"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_depth_reading_id_depth_readings_id_fk" FOREIGN KEY ("depth_reading_id") REFERENCES "public"."depth_readings"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_uploaded_by_user_id_users_id_fk" FOREIGN KEY ("uploaded_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "photos_job_id_deleted_at_idx" ON "photos" USING btree ("job_id","deleted_at");--> statement-breakpoint
CREATE INDEX "photos_company_id_idx" ON "photos" USING btree ("company_id");--> statement-breakpoint
CREATE INDEX "photos_item_id_idx" ON "photos" USING btree ("item_id");--> statement-breakpoint
CREATE INDEX "photos_run_id_idx" ON "photos" USING btree ("run_id");--> statement-breakpoint
CREATE INDEX "photos_depth_reading_id_idx" ON "photos" USING btree ("depth_reading_id");--> statement-breakpoint
CREATE INDEX "photos_uploaded_by_user_id_idx" ON "photos" USING btree ("uploaded_by_user_id");
CREATE TABLE "site_features" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"kind" text NOT NULL,
	"name" text NOT NULL,
	"shape" text NOT NULL,
	"points" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_features_kind_known" CHECK ("site_features"."kind" in ('house', 'outbuilding', 'fence', 'wall', 'patio', 'path', 'pool', 'spa', 'driveway', 'tree', 'bed', 'other')),
	CONSTRAINT "site_features_shape_known" CHECK ("site_features"."shape" in ('polygon', 'line')),
	CONSTRAINT "site_features_points_enough" CHECK (jsonb_typeof("site_features"."points") = 'array' and jsonb_array_length("site_features"."points") >= (case when "site_features"."shape" = 'polygon' then 3 else 2 end))
);
--> statement-breakpoint
ALTER TABLE "site_features" ADD CONSTRAINT "site_features_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_features_site_id_idx" ON "site_features" USING btree ("site_id","seq");
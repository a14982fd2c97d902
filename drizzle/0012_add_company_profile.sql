ALTER TABLE "company_settings" ADD COLUMN "website" text;--> statement-breakpoint
ALTER TABLE "company_settings" ADD COLUMN "postal_address" text;--> statement-breakpoint
ALTER TABLE "company_settings" ADD COLUMN "time_zone" text;--> statement-breakpoint
ALTER TABLE "company_settings" ADD COLUMN "locale" text DEFAULT 'en-US' NOT NULL;--> statement-breakpoint
ALTER TABLE "company_settings" ADD COLUMN "depth_rules" jsonb;
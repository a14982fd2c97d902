ALTER TABLE "packet_deliveries" ADD COLUMN "wants_pdf_attached" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "packet_deliveries" ADD COLUMN "dismissed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "packet_deliveries" ADD COLUMN "dismissed_by_user_id" uuid;--> statement-breakpoint
ALTER TABLE "packet_deliveries" ADD CONSTRAINT "packet_deliveries_dismissed_by_user_id_users_id_fk" FOREIGN KEY ("dismissed_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "packet_deliveries_company_id_status_idx" ON "packet_deliveries" USING btree ("company_id","status");
CREATE TYPE "public"."delivery_status" AS ENUM('queued', 'sending', 'sent', 'failed');--> statement-breakpoint
CREATE TABLE "invitation_sites" (
	"invitation_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	CONSTRAINT "invitation_sites_invitation_id_site_id_pk" PRIMARY KEY("invitation_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "locate_link_accesses" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"link_id" uuid NOT NULL,
	"accessed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"ip" text,
	"user_agent" text
);
--> statement-breakpoint
CREATE TABLE "locate_links" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"created_by_user_id" uuid,
	"token_hash" text NOT NULL,
	"note" text,
	"expires_at" timestamp with time zone NOT NULL,
	"revoked_at" timestamp with time zone,
	"is_long_lived" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "packet_deliveries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"revision_id" uuid NOT NULL,
	"to_address" text NOT NULL,
	"cc_addresses" text[] DEFAULT '{}'::text[] NOT NULL,
	"message" text,
	"status" "delivery_status" DEFAULT 'queued' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"is_pdf_attached" boolean,
	"message_id" text,
	"invitation_id" uuid,
	"requested_by_user_id" uuid,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "packet_deliveries_sent_has_time" CHECK ("packet_deliveries"."status" <> 'sent' or "packet_deliveries"."sent_at" is not null)
);
--> statement-breakpoint
CREATE TABLE "revision_locate_links" (
	"revision_id" uuid PRIMARY KEY NOT NULL,
	"link_id" uuid NOT NULL,
	"url" text NOT NULL
);
--> statement-breakpoint
ALTER TABLE "invitation_sites" ADD CONSTRAINT "invitation_sites_invitation_id_invitations_id_fk" FOREIGN KEY ("invitation_id") REFERENCES "public"."invitations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitation_sites" ADD CONSTRAINT "invitation_sites_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "locate_link_accesses" ADD CONSTRAINT "locate_link_accesses_link_id_locate_links_id_fk" FOREIGN KEY ("link_id") REFERENCES "public"."locate_links"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "locate_links" ADD CONSTRAINT "locate_links_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "locate_links" ADD CONSTRAINT "locate_links_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "locate_links" ADD CONSTRAINT "locate_links_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_deliveries" ADD CONSTRAINT "packet_deliveries_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_deliveries" ADD CONSTRAINT "packet_deliveries_revision_id_packet_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."packet_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_deliveries" ADD CONSTRAINT "packet_deliveries_invitation_id_invitations_id_fk" FOREIGN KEY ("invitation_id") REFERENCES "public"."invitations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_deliveries" ADD CONSTRAINT "packet_deliveries_requested_by_user_id_users_id_fk" FOREIGN KEY ("requested_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_locate_links" ADD CONSTRAINT "revision_locate_links_revision_id_packet_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."packet_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_locate_links" ADD CONSTRAINT "revision_locate_links_link_id_locate_links_id_fk" FOREIGN KEY ("link_id") REFERENCES "public"."locate_links"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "locate_link_accesses_link_id_accessed_at_idx" ON "locate_link_accesses" USING btree ("link_id","accessed_at");--> statement-breakpoint
CREATE UNIQUE INDEX "locate_links_token_hash_key" ON "locate_links" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "locate_links_site_id_created_at_idx" ON "locate_links" USING btree ("site_id","created_at");--> statement-breakpoint
CREATE INDEX "packet_deliveries_revision_id_created_at_idx" ON "packet_deliveries" USING btree ("revision_id","created_at");--> statement-breakpoint
CREATE INDEX "packet_deliveries_status_updated_at_idx" ON "packet_deliveries" USING btree ("status","updated_at");
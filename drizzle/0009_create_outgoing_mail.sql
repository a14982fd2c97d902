CREATE TYPE "public"."outgoing_mail_kind" AS ENUM('invitation', 'password_reset');--> statement-breakpoint
CREATE TYPE "public"."outgoing_mail_status" AS ENUM('queued', 'sending', 'sent', 'failed', 'cancelled');--> statement-breakpoint
CREATE TABLE "outgoing_mail" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"kind" "outgoing_mail_kind" NOT NULL,
	"to_address" text NOT NULL,
	"data" jsonb NOT NULL,
	"invitation_id" uuid,
	"password_reset_id" uuid,
	"status" "outgoing_mail_status" DEFAULT 'queued' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"message_id" text,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "outgoing_mail_sent_has_time" CHECK ("outgoing_mail"."status" <> 'sent' or "outgoing_mail"."sent_at" is not null),
	CONSTRAINT "outgoing_mail_kind_has_target" CHECK (("outgoing_mail"."kind" = 'invitation' and "outgoing_mail"."invitation_id" is not null) or ("outgoing_mail"."kind" = 'password_reset' and "outgoing_mail"."password_reset_id" is not null))
);
--> statement-breakpoint
ALTER TABLE "outgoing_mail" ADD CONSTRAINT "outgoing_mail_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "outgoing_mail" ADD CONSTRAINT "outgoing_mail_invitation_id_invitations_id_fk" FOREIGN KEY ("invitation_id") REFERENCES "public"."invitations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "outgoing_mail" ADD CONSTRAINT "outgoing_mail_password_reset_id_password_reset_tokens_id_fk" FOREIGN KEY ("password_reset_id") REFERENCES "public"."password_reset_tokens"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "outgoing_mail_status_updated_at_idx" ON "outgoing_mail" USING btree ("status","updated_at");--> statement-breakpoint
CREATE INDEX "outgoing_mail_invitation_id_idx" ON "outgoing_mail" USING btree ("invitation_id");--> statement-breakpoint
CREATE INDEX "outgoing_mail_password_reset_id_idx" ON "outgoing_mail" USING btree ("password_reset_id");
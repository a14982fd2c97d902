ALTER TYPE "public"."outgoing_mail_kind" ADD VALUE 'signup_verification';--> statement-breakpoint
ALTER TYPE "public"."outgoing_mail_kind" ADD VALUE 'signup_notice';--> statement-breakpoint
CREATE TABLE "company_invite_codes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code_hash" text NOT NULL,
	"note" text,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"used_by_company_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "company_signups" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"company_name" text NOT NULL,
	"admin_name" text NOT NULL,
	"password_hash" text NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"invite_code_id" uuid,
	"completed_at" timestamp with time zone,
	"company_id" uuid,
	"superseded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "outgoing_mail" DROP CONSTRAINT "outgoing_mail_kind_has_target";--> statement-breakpoint
ALTER TABLE "outgoing_mail" ALTER COLUMN "company_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "outgoing_mail" ADD COLUMN "signup_id" uuid;--> statement-breakpoint
ALTER TABLE "outgoing_mail" ADD COLUMN "receipt_hash" text;--> statement-breakpoint
ALTER TABLE "company_invite_codes" ADD CONSTRAINT "company_invite_codes_used_by_company_id_companies_id_fk" FOREIGN KEY ("used_by_company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "company_signups" ADD CONSTRAINT "company_signups_invite_code_id_company_invite_codes_id_fk" FOREIGN KEY ("invite_code_id") REFERENCES "public"."company_invite_codes"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "company_signups" ADD CONSTRAINT "company_signups_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "company_invite_codes_code_hash_key" ON "company_invite_codes" USING btree ("code_hash");--> statement-breakpoint
CREATE UNIQUE INDEX "company_signups_token_hash_key" ON "company_signups" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "company_signups_email_idx" ON "company_signups" USING btree ("email");--> statement-breakpoint
CREATE UNIQUE INDEX "company_signups_open_email_key" ON "company_signups" USING btree ("email") WHERE "company_signups"."completed_at" is null and "company_signups"."superseded_at" is null;--> statement-breakpoint
ALTER TABLE "outgoing_mail" ADD CONSTRAINT "outgoing_mail_signup_id_company_signups_id_fk" FOREIGN KEY ("signup_id") REFERENCES "public"."company_signups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "outgoing_mail_signup_id_idx" ON "outgoing_mail" USING btree ("signup_id");--> statement-breakpoint
CREATE INDEX "outgoing_mail_receipt_hash_idx" ON "outgoing_mail" USING btree ("receipt_hash");--> statement-breakpoint
ALTER TABLE "outgoing_mail" ADD CONSTRAINT "outgoing_mail_kind_has_target" CHECK (("outgoing_mail"."kind" = 'invitation' and "outgoing_mail"."invitation_id" is not null and "outgoing_mail"."company_id" is not null) or ("outgoing_mail"."kind" = 'password_reset' and "outgoing_mail"."password_reset_id" is not null and "outgoing_mail"."company_id" is not null) or ("outgoing_mail"."kind" <> 'invitation' and "outgoing_mail"."kind" <> 'password_reset' and ("outgoing_mail"."signup_id" is not null or "outgoing_mail"."company_id" is not null)));
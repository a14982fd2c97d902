CREATE TYPE "public"."packet_status" AS ENUM('queued', 'rendering', 'ready', 'failed');--> statement-breakpoint
CREATE TYPE "public"."paper_size" AS ENUM('letter', 'a4');--> statement-breakpoint
CREATE TYPE "public"."signature_role" AS ENUM('lead', 'homeowner');--> statement-breakpoint
CREATE TYPE "public"."unit_system" AS ENUM('imperial', 'metric');--> statement-breakpoint
CREATE TABLE "company_settings" (
	"company_id" uuid PRIMARY KEY NOT NULL,
	"paper_size" "paper_size" DEFAULT 'letter' NOT NULL,
	"units" "unit_system" DEFAULT 'imperial' NOT NULL,
	"licence_numbers" text[] DEFAULT '{}'::text[] NOT NULL,
	"contact_phone" text,
	"contact_email" text,
	"logo_key" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "packet_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"revision" integer NOT NULL,
	"status" "packet_status" DEFAULT 'queued' NOT NULL,
	"failure_reason" text,
	"attempts" integer DEFAULT 0 NOT NULL,
	"snapshot" jsonb NOT NULL,
	"paper_size" "paper_size" NOT NULL,
	"pdf_key" text,
	"pdf_bytes" bigint,
	"pdf_sha256" text,
	"page_count" integer,
	"zip_key" text,
	"zip_bytes" bigint,
	"zip_sha256" text,
	"issued_by_user_id" uuid,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"rendered_at" timestamp with time zone,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "packet_revisions_job_id_revision_key" UNIQUE("job_id","revision"),
	CONSTRAINT "packet_revisions_revision_positive" CHECK ("packet_revisions"."revision" >= 1),
	CONSTRAINT "packet_revisions_ready_has_files" CHECK ("packet_revisions"."status" <> 'ready' or ("packet_revisions"."pdf_key" is not null and "packet_revisions"."pdf_sha256" is not null and "packet_revisions"."zip_key" is not null and "packet_revisions"."zip_sha256" is not null))
);
--> statement-breakpoint
CREATE TABLE "packet_signatures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"role" "signature_role" NOT NULL,
	"signer_name" text NOT NULL,
	"signed_at" timestamp with time zone NOT NULL,
	"svg_path" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "packet_signatures_revision_id_role_key" UNIQUE("revision_id","role")
);
--> statement-breakpoint
ALTER TABLE "company_settings" ADD CONSTRAINT "company_settings_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_revisions" ADD CONSTRAINT "packet_revisions_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_revisions" ADD CONSTRAINT "packet_revisions_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_revisions" ADD CONSTRAINT "packet_revisions_issued_by_user_id_users_id_fk" FOREIGN KEY ("issued_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "packet_signatures" ADD CONSTRAINT "packet_signatures_revision_id_packet_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."packet_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "packet_revisions_company_id_issued_at_idx" ON "packet_revisions" USING btree ("company_id","issued_at");
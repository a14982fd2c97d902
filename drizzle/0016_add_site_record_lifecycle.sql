CREATE TYPE "public"."site_record_change" AS ENUM('changed', 'abandoned', 'removed');--> statement-breakpoint
CREATE TYPE "public"."site_record_kind" AS ENUM('item', 'run');--> statement-breakpoint
CREATE TABLE "site_record_changes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"record_kind" "site_record_kind" NOT NULL,
	"record_id" uuid NOT NULL,
	"change" "site_record_change" NOT NULL,
	"before" jsonb NOT NULL,
	"changed_on" date NOT NULL,
	"issued_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_record_changes_job_id_record_id_key" UNIQUE("job_id","record_id")
);
--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "site_id" uuid;--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "installed_on" date;--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "abandoned_by_job_id" uuid;--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "abandoned_on" date;--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "removed_by_job_id" uuid;--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "removed_on" date;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "site_id" uuid;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "installed_on" date;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "abandoned_by_job_id" uuid;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "abandoned_on" date;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "removed_by_job_id" uuid;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "removed_on" date;--> statement-breakpoint
-- Existing job-scoped records become site records installed by their job on its work date (end date,
-- else start date, else the day the job was created); runs already marked abandoned were abandoned by
-- their own job on that date.
UPDATE "items" SET "site_id" = "jobs"."site_id", "installed_on" = coalesce("jobs"."end_date", "jobs"."start_date", "jobs"."created_at"::date) FROM "jobs" WHERE "jobs"."id" = "items"."job_id";--> statement-breakpoint
UPDATE "runs" SET "site_id" = "jobs"."site_id", "installed_on" = coalesce("jobs"."end_date", "jobs"."start_date", "jobs"."created_at"::date) FROM "jobs" WHERE "jobs"."id" = "runs"."job_id";--> statement-breakpoint
UPDATE "runs" SET "abandoned_by_job_id" = "job_id", "abandoned_on" = "installed_on" WHERE "is_abandoned";--> statement-breakpoint
ALTER TABLE "items" ALTER COLUMN "site_id" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "items" ALTER COLUMN "installed_on" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "runs" ALTER COLUMN "site_id" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "runs" ALTER COLUMN "installed_on" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "site_record_changes" ADD CONSTRAINT "site_record_changes_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_record_changes" ADD CONSTRAINT "site_record_changes_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_record_changes_record_id_idx" ON "site_record_changes" USING btree ("record_id");--> statement-breakpoint
CREATE INDEX "site_record_changes_site_id_idx" ON "site_record_changes" USING btree ("site_id");--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_abandoned_by_job_id_jobs_id_fk" FOREIGN KEY ("abandoned_by_job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_removed_by_job_id_jobs_id_fk" FOREIGN KEY ("removed_by_job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_abandoned_by_job_id_jobs_id_fk" FOREIGN KEY ("abandoned_by_job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_removed_by_job_id_jobs_id_fk" FOREIGN KEY ("removed_by_job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "items_site_id_idx" ON "items" USING btree ("site_id","seq");--> statement-breakpoint
CREATE INDEX "runs_site_id_idx" ON "runs" USING btree ("site_id","seq");--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_abandoned_complete" CHECK (("items"."abandoned_by_job_id" is null) = ("items"."abandoned_on" is null));--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_removed_complete" CHECK (("items"."removed_by_job_id" is null) = ("items"."removed_on" is null));--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_abandoned_complete" CHECK (("runs"."abandoned_by_job_id" is null) = ("runs"."abandoned_on" is null));--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_removed_complete" CHECK (("runs"."removed_by_job_id" is null) = ("runs"."removed_on" is null));
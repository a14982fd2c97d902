ALTER TABLE "zones" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
-- Existing zones were added before anything issued since: date them from their job, so every zone an
-- issued job recorded stays part of the site's record for the other jobs.
UPDATE "zones" SET "created_at" = "jobs"."created_at" FROM "jobs" WHERE "jobs"."id" = "zones"."job_id";

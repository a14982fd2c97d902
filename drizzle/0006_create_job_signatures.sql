CREATE TABLE "job_signatures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"role" "signature_role" NOT NULL,
	"signer_name" text NOT NULL,
	"signed_at" timestamp with time zone NOT NULL,
	"svg_path" text NOT NULL,
	"captured_by_user_id" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "job_signatures_job_id_role_key" UNIQUE("job_id","role")
);
--> statement-breakpoint
ALTER TABLE "job_signatures" ADD CONSTRAINT "job_signatures_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_signatures" ADD CONSTRAINT "job_signatures_captured_by_user_id_users_id_fk" FOREIGN KEY ("captured_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;
CREATE TYPE "public"."burial_location" AS ENUM('general', 'under_hardscape', 'under_driveway', 'under_street', 'trench_below_concrete', 'under_building');--> statement-breakpoint
CREATE TYPE "public"."channel_polarity" AS ENUM('normal', 'inverted');--> statement-breakpoint
CREATE TYPE "public"."check_quantity" AS ENUM('dc_resistance', 'impedance');--> statement-breakpoint
CREATE TYPE "public"."coil_wiring" AS ENUM('series', 'parallel', 'separate_channels');--> statement-breakpoint
CREATE TYPE "public"."cv_line_voltage" AS ENUM('25V', '70V', '100V');--> statement-breakpoint
CREATE TYPE "public"."gauge_system" AS ENUM('awg', 'mm2');--> statement-breakpoint
CREATE TYPE "public"."install_method" AS ENUM('direct_burial', 'conduit', 'under_hardscape_sleeve', 'indoor');--> statement-breakpoint
CREATE TYPE "public"."item_kind" AS ENUM('amplifier', 'speaker', 'subwoofer', 'junction', 'spare_end', 'wall_entry');--> statement-breakpoint
CREATE TYPE "public"."job_status" AS ENUM('draft', 'in_progress', 'submitted', 'ready_to_issue', 'issued');--> statement-breakpoint
CREATE TYPE "public"."onward_wiring" AS ENUM('parallel', 'series');--> statement-breakpoint
CREATE TYPE "public"."position_source" AS ENUM('ties', 'manual', 'gps');--> statement-breakpoint
CREATE TYPE "public"."side_hint" AS ENUM('left', 'right');--> statement-breakpoint
CREATE TYPE "public"."voice_coils" AS ENUM('single', 'dual');--> statement-breakpoint
CREATE TABLE "customers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"name" text NOT NULL,
	"email" text,
	"phone" text,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "amplifier_channels" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"item_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"name" text NOT NULL,
	"cv_line_voltage" "cv_line_voltage",
	"cv_rated_watts" double precision,
	"source" text,
	"gain" text,
	"volume_limit" text,
	"eq" text,
	"crossover" text,
	"polarity" "channel_polarity",
	"firmware" text,
	"network_name" text,
	"setup_notes" text,
	CONSTRAINT "amplifier_channels_item_id_id_key" UNIQUE("item_id","id"),
	CONSTRAINT "amplifier_channels_cv_complete" CHECK (("amplifier_channels"."cv_line_voltage" is null) = ("amplifier_channels"."cv_rated_watts" is null))
);
--> statement-breakpoint
CREATE TABLE "commissioning_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"amplifier_item_id" uuid NOT NULL,
	"channel_id" uuid NOT NULL,
	"quantity" "check_quantity" NOT NULL,
	"measured_ohm" double precision NOT NULL,
	"frequency_hz" double precision,
	"is_polarity_ok" boolean,
	"is_insulation_ok" boolean,
	"notes" text,
	"recorded_by_user_id" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "depth_readings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"station_m" double precision NOT NULL,
	"depth_m" double precision NOT NULL,
	"recorded_by_user_id" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "item_ties" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"item_id" uuid NOT NULL,
	"reference_point_id" uuid NOT NULL,
	"ordinal" smallint NOT NULL,
	"distance_m" double precision NOT NULL,
	CONSTRAINT "item_ties_item_id_reference_point_id_key" UNIQUE("item_id","reference_point_id"),
	CONSTRAINT "item_ties_item_id_ordinal_key" UNIQUE("item_id","ordinal")
);
--> statement-breakpoint
CREATE TABLE "items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"kind" "item_kind" NOT NULL,
	"label" text NOT NULL,
	"model" text,
	"serial" text,
	"zone_id" uuid,
	"install_date" date,
	"warranty_end" date,
	"position_x" double precision,
	"position_y" double precision,
	"position_source" "position_source",
	"position_accuracy_m" double precision,
	"side_hint" "side_hint",
	"notes" text,
	"rated_watts_8_ohm" double precision,
	"rated_watts_4_ohm" double precision,
	"minimum_impedance_ohm" double precision,
	"nominal_impedance_ohm" double precision,
	"cv_line_voltage" "cv_line_voltage",
	"cv_tap_watts" double precision,
	"dc_resistance_ohm" double precision,
	"onward_wiring" "onward_wiring",
	"voice_coils" "voice_coils",
	"coil_impedance_ohm" double precision,
	"coil_wiring" "coil_wiring",
	"dc_resistance_ohm_per_coil" double precision,
	"splice_type" text,
	"is_accessible" boolean,
	"is_capped" boolean,
	"marker" text,
	"wall_material" text,
	"hole_diameter_m" double precision,
	"sleeve" text,
	"sealant" text,
	"inside_location" text,
	"outside_location" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "items_position_complete" CHECK (("items"."position_x" is null) = ("items"."position_y" is null) and ("items"."position_x" is null) = ("items"."position_source" is null)),
	CONSTRAINT "items_amplifier_fields" CHECK ("items"."kind" <> 'amplifier' or ("items"."rated_watts_8_ohm" is not null and "items"."minimum_impedance_ohm" is not null)),
	CONSTRAINT "items_speaker_fields" CHECK ("items"."kind" <> 'speaker' or (("items"."nominal_impedance_ohm" is null) <> ("items"."cv_tap_watts" is null) and ("items"."cv_tap_watts" is null) = ("items"."cv_line_voltage" is null))),
	CONSTRAINT "items_subwoofer_fields" CHECK ("items"."kind" <> 'subwoofer' or ("items"."voice_coils" is not null and "items"."coil_impedance_ohm" is not null)),
	CONSTRAINT "items_spare_end_fields" CHECK ("items"."kind" <> 'spare_end' or "items"."is_capped" is not null)
);
--> statement-breakpoint
CREATE TABLE "job_technicians" (
	"job_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	CONSTRAINT "job_technicians_job_id_user_id_pk" PRIMARY KEY("job_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "jobs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"title" text NOT NULL,
	"crew_lead_user_id" uuid,
	"start_date" date,
	"end_date" date,
	"status" "job_status" DEFAULT 'draft' NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"notes" text,
	"review_comment" text,
	"created_by_user_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "jobs_revision_positive" CHECK ("jobs"."revision" >= 1),
	CONSTRAINT "jobs_dates_ordered" CHECK ("jobs"."start_date" is null or "jobs"."end_date" is null or "jobs"."start_date" <= "jobs"."end_date")
);
--> statement-breakpoint
CREATE TABLE "run_pairs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"pair_index" smallint NOT NULL,
	"amplifier_item_id" uuid,
	"channel_id" uuid,
	CONSTRAINT "run_pairs_run_id_pair_index_key" UNIQUE("run_id","pair_index"),
	CONSTRAINT "run_pairs_channel_complete" CHECK (("run_pairs"."amplifier_item_id" is null) = ("run_pairs"."channel_id" is null))
);
--> statement-breakpoint
CREATE TABLE "run_route_points" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"ordinal" integer NOT NULL,
	"x" double precision NOT NULL,
	"y" double precision NOT NULL,
	CONSTRAINT "run_route_points_run_id_ordinal_key" UNIQUE("run_id","ordinal")
);
--> statement-breakpoint
CREATE TABLE "runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"label" text NOT NULL,
	"from_item_id" uuid NOT NULL,
	"to_item_id" uuid NOT NULL,
	"cable_type" text NOT NULL,
	"gauge_system" "gauge_system" NOT NULL,
	"gauge_awg" integer,
	"gauge_mm2" double precision,
	"conductors" integer NOT NULL,
	"measured_length_m" double precision NOT NULL,
	"method" "install_method" NOT NULL,
	"location" "burial_location",
	"is_spare" boolean DEFAULT false NOT NULL,
	"is_abandoned" boolean DEFAULT false NOT NULL,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "runs_gauge_matches_system" CHECK (("runs"."gauge_system" = 'awg' and "runs"."gauge_awg" is not null and "runs"."gauge_mm2" is null)
        or ("runs"."gauge_system" = 'mm2' and "runs"."gauge_mm2" is not null and "runs"."gauge_awg" is null)),
	CONSTRAINT "runs_ends_differ" CHECK ("runs"."from_item_id" <> "runs"."to_item_id")
);
--> statement-breakpoint
CREATE TABLE "zones" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"name" text NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reference_points" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"seq" bigserial NOT NULL,
	"label" text NOT NULL,
	"x" double precision NOT NULL,
	"y" double precision NOT NULL,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "site_homeowners" (
	"site_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_homeowners_site_id_user_id_pk" PRIMARY KEY("site_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"customer_id" uuid NOT NULL,
	"label" text NOT NULL,
	"address_line1" text NOT NULL,
	"address_line2" text,
	"city" text NOT NULL,
	"region" text,
	"postal_code" text,
	"country" text NOT NULL,
	"north_azimuth_deg" double precision DEFAULT 0 NOT NULL,
	"origin_lat" double precision,
	"origin_lon" double precision,
	"plan_image_ref" text,
	"plan_cal_a_x" double precision,
	"plan_cal_a_y" double precision,
	"plan_cal_b_x" double precision,
	"plan_cal_b_y" double precision,
	"plan_cal_distance_m" double precision,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sites_origin_complete" CHECK (("sites"."origin_lat" is null) = ("sites"."origin_lon" is null)),
	CONSTRAINT "sites_plan_calibration_complete" CHECK (("sites"."plan_cal_a_x" is null) = ("sites"."plan_cal_distance_m" is null) and ("sites"."plan_cal_a_y" is null) = ("sites"."plan_cal_distance_m" is null)
        and ("sites"."plan_cal_b_x" is null) = ("sites"."plan_cal_distance_m" is null) and ("sites"."plan_cal_b_y" is null) = ("sites"."plan_cal_distance_m" is null))
);
--> statement-breakpoint
ALTER TABLE "customers" ADD CONSTRAINT "customers_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "amplifier_channels" ADD CONSTRAINT "amplifier_channels_item_id_items_id_fk" FOREIGN KEY ("item_id") REFERENCES "public"."items"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "commissioning_checks" ADD CONSTRAINT "commissioning_checks_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "commissioning_checks" ADD CONSTRAINT "commissioning_checks_recorded_by_user_id_users_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "commissioning_checks" ADD CONSTRAINT "commissioning_checks_channel_fk" FOREIGN KEY ("amplifier_item_id","channel_id") REFERENCES "public"."amplifier_channels"("item_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "depth_readings" ADD CONSTRAINT "depth_readings_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "depth_readings" ADD CONSTRAINT "depth_readings_recorded_by_user_id_users_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "item_ties" ADD CONSTRAINT "item_ties_item_id_items_id_fk" FOREIGN KEY ("item_id") REFERENCES "public"."items"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "item_ties" ADD CONSTRAINT "item_ties_reference_point_id_reference_points_id_fk" FOREIGN KEY ("reference_point_id") REFERENCES "public"."reference_points"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_zone_id_zones_id_fk" FOREIGN KEY ("zone_id") REFERENCES "public"."zones"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_technicians" ADD CONSTRAINT "job_technicians_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_technicians" ADD CONSTRAINT "job_technicians_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_crew_lead_user_id_users_id_fk" FOREIGN KEY ("crew_lead_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_pairs" ADD CONSTRAINT "run_pairs_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_pairs" ADD CONSTRAINT "run_pairs_channel_fk" FOREIGN KEY ("amplifier_item_id","channel_id") REFERENCES "public"."amplifier_channels"("item_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_route_points" ADD CONSTRAINT "run_route_points_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_from_item_id_items_id_fk" FOREIGN KEY ("from_item_id") REFERENCES "public"."items"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_to_item_id_items_id_fk" FOREIGN KEY ("to_item_id") REFERENCES "public"."items"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "zones" ADD CONSTRAINT "zones_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reference_points" ADD CONSTRAINT "reference_points_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_homeowners" ADD CONSTRAINT "site_homeowners_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_homeowners" ADD CONSTRAINT "site_homeowners_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "customers_company_id_name_idx" ON "customers" USING btree ("company_id","name");--> statement-breakpoint
CREATE INDEX "amplifier_channels_item_id_idx" ON "amplifier_channels" USING btree ("item_id","seq");--> statement-breakpoint
CREATE INDEX "commissioning_checks_job_id_idx" ON "commissioning_checks" USING btree ("job_id","seq");--> statement-breakpoint
CREATE INDEX "commissioning_checks_amplifier_item_id_channel_id_idx" ON "commissioning_checks" USING btree ("amplifier_item_id","channel_id");--> statement-breakpoint
CREATE INDEX "commissioning_checks_channel_id_idx" ON "commissioning_checks" USING btree ("channel_id");--> statement-breakpoint
CREATE INDEX "commissioning_checks_recorded_by_user_id_idx" ON "commissioning_checks" USING btree ("recorded_by_user_id");--> statement-breakpoint
CREATE INDEX "depth_readings_run_id_idx" ON "depth_readings" USING btree ("run_id","station_m");--> statement-breakpoint
CREATE INDEX "depth_readings_recorded_by_user_id_idx" ON "depth_readings" USING btree ("recorded_by_user_id");--> statement-breakpoint
CREATE INDEX "item_ties_reference_point_id_idx" ON "item_ties" USING btree ("reference_point_id");--> statement-breakpoint
CREATE INDEX "items_job_id_idx" ON "items" USING btree ("job_id","seq");--> statement-breakpoint
CREATE INDEX "items_zone_id_idx" ON "items" USING btree ("zone_id");--> statement-breakpoint
CREATE INDEX "job_technicians_user_id_idx" ON "job_technicians" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "jobs_company_id_status_idx" ON "jobs" USING btree ("company_id","status");--> statement-breakpoint
CREATE INDEX "jobs_company_id_updated_at_idx" ON "jobs" USING btree ("company_id","updated_at");--> statement-breakpoint
CREATE INDEX "jobs_site_id_idx" ON "jobs" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "jobs_crew_lead_user_id_idx" ON "jobs" USING btree ("crew_lead_user_id");--> statement-breakpoint
CREATE INDEX "jobs_created_by_user_id_idx" ON "jobs" USING btree ("created_by_user_id");--> statement-breakpoint
CREATE INDEX "run_pairs_amplifier_item_id_channel_id_idx" ON "run_pairs" USING btree ("amplifier_item_id","channel_id");--> statement-breakpoint
CREATE INDEX "run_pairs_channel_id_idx" ON "run_pairs" USING btree ("channel_id");--> statement-breakpoint
CREATE INDEX "runs_job_id_idx" ON "runs" USING btree ("job_id","seq");--> statement-breakpoint
CREATE INDEX "runs_from_item_id_idx" ON "runs" USING btree ("from_item_id");--> statement-breakpoint
CREATE INDEX "runs_to_item_id_idx" ON "runs" USING btree ("to_item_id");--> statement-breakpoint
CREATE INDEX "zones_job_id_idx" ON "zones" USING btree ("job_id","seq");--> statement-breakpoint
CREATE INDEX "reference_points_site_id_idx" ON "reference_points" USING btree ("site_id","seq");--> statement-breakpoint
CREATE INDEX "site_homeowners_user_id_idx" ON "site_homeowners" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "sites_company_id_label_idx" ON "sites" USING btree ("company_id","label");--> statement-breakpoint
CREATE INDEX "sites_customer_id_idx" ON "sites" USING btree ("customer_id");
ALTER TABLE "run_route_points" ADD COLUMN "source" "position_source";--> statement-breakpoint
ALTER TABLE "run_route_points" ADD COLUMN "accuracy_m" double precision;--> statement-breakpoint
ALTER TABLE "run_route_points" ADD CONSTRAINT "run_route_points_gps_accuracy" CHECK ("run_route_points"."source" is distinct from 'gps' or "run_route_points"."accuracy_m" is not null);--> statement-breakpoint
ALTER TABLE "run_route_points" ADD CONSTRAINT "run_route_points_accuracy_nonnegative" CHECK ("run_route_points"."accuracy_m" is null or "run_route_points"."accuracy_m" >= 0);
ALTER TABLE "tank_limits" ADD COLUMN "rate_max_change" double precision;--> statement-breakpoint
ALTER TABLE "tank_limits" ADD COLUMN "rate_per_hours" double precision;
CREATE TABLE "latest_readings" (
	"tank_id" uuid NOT NULL,
	"parameter" "parameter_key" NOT NULL,
	"reading_id" bigint NOT NULL,
	"value" double precision NOT NULL,
	"measured_at" timestamp with time zone NOT NULL,
	"source" "reading_source" NOT NULL,
	"device_id" uuid,
	"device_moments" timestamp with time zone[],
	CONSTRAINT "latest_readings_tank_id_parameter_pk" PRIMARY KEY("tank_id","parameter")
);
--> statement-breakpoint
CREATE TABLE "reading_rollups_daily" (
	"tank_id" uuid NOT NULL,
	"parameter" "parameter_key" NOT NULL,
	"bucket_start" timestamp with time zone NOT NULL,
	"min" double precision NOT NULL,
	"max" double precision NOT NULL,
	"sum" double precision NOT NULL,
	"count" integer NOT NULL,
	"device_count" integer NOT NULL,
	"home_count" integer NOT NULL,
	"visit_count" integer NOT NULL,
	"last_value" double precision NOT NULL,
	"last_at" timestamp with time zone NOT NULL,
	CONSTRAINT "reading_rollups_daily_tank_id_parameter_bucket_start_pk" PRIMARY KEY("tank_id","parameter","bucket_start")
);
--> statement-breakpoint
CREATE TABLE "reading_rollups_hourly" (
	"tank_id" uuid NOT NULL,
	"parameter" "parameter_key" NOT NULL,
	"bucket_start" timestamp with time zone NOT NULL,
	"min" double precision NOT NULL,
	"max" double precision NOT NULL,
	"sum" double precision NOT NULL,
	"count" integer NOT NULL,
	"device_count" integer NOT NULL,
	"home_count" integer NOT NULL,
	"visit_count" integer NOT NULL,
	"last_value" double precision NOT NULL,
	"last_at" timestamp with time zone NOT NULL,
	CONSTRAINT "reading_rollups_hourly_tank_id_parameter_bucket_start_pk" PRIMARY KEY("tank_id","parameter","bucket_start")
);
--> statement-breakpoint
ALTER TABLE "latest_readings" ADD CONSTRAINT "latest_readings_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_rollups_daily" ADD CONSTRAINT "reading_rollups_daily_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_rollups_hourly" ADD CONSTRAINT "reading_rollups_hourly_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "readings_people_idx" ON "readings" USING btree ("tank_id","parameter","measured_at") WHERE "readings"."source" <> 'device';
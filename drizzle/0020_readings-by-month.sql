-- readings becomes a table partitioned by month of measured_at: charts and exports read only the
-- months they ask for, and old months can be trimmed or detached whole. Months from a year back to
-- three months ahead exist; older readings land in readings_older; a daily job makes the months
-- ahead (ensure_reading_partitions, api/services/workers.ts). The summary triggers move across.
ALTER TABLE "readings" RENAME TO "readings_before_partitioning";
--> statement-breakpoint
ALTER TABLE "readings_before_partitioning" RENAME CONSTRAINT "readings_id_measured_at_pk" TO "readings_before_partitioning_pk";
--> statement-breakpoint
ALTER INDEX "readings_history_idx" RENAME TO "readings_before_partitioning_history_idx";
--> statement-breakpoint
ALTER INDEX "readings_device_key" RENAME TO "readings_before_partitioning_device_key";
--> statement-breakpoint
ALTER INDEX "readings_people_idx" RENAME TO "readings_before_partitioning_people_idx";
--> statement-breakpoint
DROP TRIGGER "readings_summaries_insert" ON "readings_before_partitioning";
--> statement-breakpoint
DROP TRIGGER "readings_summaries_delete" ON "readings_before_partitioning";
--> statement-breakpoint
DROP TRIGGER "readings_summaries_update" ON "readings_before_partitioning";
--> statement-breakpoint
CREATE TABLE "readings" (
	"id" bigint GENERATED ALWAYS AS IDENTITY NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"parameter" "parameter_key" NOT NULL,
	"value" double precision NOT NULL,
	"entered_value" double precision NOT NULL,
	"entered_unit" text NOT NULL,
	"measured_at" timestamp with time zone NOT NULL,
	"source" "reading_source" NOT NULL,
	"recorded_by" uuid,
	"device_id" uuid,
	"method" text,
	"note" text,
	"sample_temp_c" double precision,
	"reference_temp_c" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "readings_id_measured_at_pk" PRIMARY KEY("id","measured_at")
) PARTITION BY RANGE ("measured_at");
--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;
--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;
--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;
--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_device_id_devices_id_fk" FOREIGN KEY ("device_id") REFERENCES "public"."devices"("id") ON DELETE restrict ON UPDATE no action;
--> statement-breakpoint
CREATE INDEX "readings_history_idx" ON "readings" USING btree ("tank_id","parameter","measured_at");
--> statement-breakpoint
CREATE UNIQUE INDEX "readings_device_key" ON "readings" USING btree ("device_id","parameter","measured_at") WHERE "readings"."device_id" is not null;
--> statement-breakpoint
CREATE INDEX "readings_people_idx" ON "readings" USING btree ("tank_id","parameter","measured_at") WHERE "readings"."source" <> 'device';
--> statement-breakpoint
CREATE TABLE "readings_older" PARTITION OF "readings" DEFAULT;
--> statement-breakpoint
-- One partition per UTC month touching [p_from, p_to], named readings_yYYYYmMM; the ones that
-- exist are left alone. Returns how many it made.
CREATE FUNCTION ensure_reading_partitions(p_from timestamptz, p_to timestamptz) RETURNS integer
LANGUAGE plpgsql AS $$
DECLARE
  month_start timestamptz := date_trunc('month', p_from AT TIME ZONE 'UTC') AT TIME ZONE 'UTC';
  made integer := 0;
  name text;
BEGIN
  WHILE month_start <= p_to LOOP
    name := 'readings_y' || to_char(month_start AT TIME ZONE 'UTC', 'YYYY') || 'm' || to_char(month_start AT TIME ZONE 'UTC', 'MM');
    IF to_regclass(name) IS NULL THEN
      EXECUTE format(
        'CREATE TABLE %I PARTITION OF readings FOR VALUES FROM (%L) TO (%L)',
        name, month_start, month_start + interval '1 month');
      made := made + 1;
    END IF;
    month_start := month_start + interval '1 month';
  END LOOP;
  RETURN made;
END
$$;
--> statement-breakpoint
SELECT ensure_reading_partitions(now() - interval '12 months', now() + interval '3 months');
--> statement-breakpoint
INSERT INTO "readings" ("id", "company_id", "tank_id", "parameter", "value", "entered_value", "entered_unit",
  "measured_at", "source", "recorded_by", "device_id", "method", "note", "sample_temp_c", "reference_temp_c",
  "created_at", "updated_at")
OVERRIDING SYSTEM VALUE
SELECT "id", "company_id", "tank_id", "parameter", "value", "entered_value", "entered_unit",
  "measured_at", "source", "recorded_by", "device_id", "method", "note", "sample_temp_c", "reference_temp_c",
  "created_at", "updated_at"
FROM "readings_before_partitioning";
--> statement-breakpoint
SELECT setval(pg_get_serial_sequence('readings', 'id'), coalesce((SELECT max("id") FROM "readings"), 0) + 1, false);
--> statement-breakpoint
DROP TABLE "readings_before_partitioning";
--> statement-breakpoint
CREATE TRIGGER readings_summaries_insert AFTER INSERT ON readings
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION reading_summaries_after_insert();
--> statement-breakpoint
CREATE TRIGGER readings_summaries_delete AFTER DELETE ON readings
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION reading_summaries_after_delete();
--> statement-breakpoint
CREATE TRIGGER readings_summaries_update AFTER UPDATE ON readings
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION reading_summaries_after_update();

CREATE TYPE "public"."equipment_kind" AS ENUM('return-pump', 'skimmer', 'heater', 'chiller', 'lighting', 'wavemaker', 'dosing-pump', 'reactor', 'controller', 'auto-top-off', 'uv-steriliser', 'filter', 'probe', 'power-board', 'other');--> statement-breakpoint
CREATE TYPE "public"."livestock_status" AS ENUM('thriving', 'stable', 'watch', 'sick', 'removed', 'died');--> statement-breakpoint
CREATE TYPE "public"."photo_subject" AS ENUM('tank', 'livestock', 'visit', 'message');--> statement-breakpoint
CREATE TYPE "public"."parameter_key" AS ENUM('temperature', 'salinity', 'ph', 'alkalinity', 'calcium', 'magnesium', 'nitrate', 'phosphate', 'ammonia', 'nitrite', 'orp', 'gh', 'kh');--> statement-breakpoint
CREATE TYPE "public"."reading_source" AS ENUM('visit', 'home-test', 'device');--> statement-breakpoint
CREATE TYPE "public"."tank_style" AS ENUM('sps-reef', 'mixed-reef', 'soft-lps-reef', 'fish-only-marine', 'planted-freshwater', 'community-freshwater', 'brackish');--> statement-breakpoint
CREATE TYPE "public"."water_type" AS ENUM('marine', 'fresh', 'brackish');--> statement-breakpoint
CREATE TABLE "equipment" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"kind" "equipment_kind" NOT NULL,
	"description" text NOT NULL,
	"installed_on" date,
	"maintenance_interval_days" integer,
	"last_serviced_on" date,
	"power_board" text,
	"outlet" text,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "company_species" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"common_name" text NOT NULL,
	"scientific_name" text NOT NULL,
	"profile" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "livestock" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"catalogue_species_id" text,
	"company_species_id" uuid,
	"nickname" text,
	"quantity" integer DEFAULT 1 NOT NULL,
	"added_on" date,
	"source" text,
	"placement" text,
	"status" "livestock_status" DEFAULT 'stable' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "livestock_one_species" CHECK (("livestock"."catalogue_species_id" is null) <> ("livestock"."company_species_id" is null)),
	CONSTRAINT "livestock_quantity_positive" CHECK ("livestock"."quantity" > 0)
);
--> statement-breakpoint
CREATE TABLE "livestock_status_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"livestock_id" uuid NOT NULL,
	"status" "livestock_status" NOT NULL,
	"note" text,
	"changed_by" uuid,
	"changed_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"livestock_id" uuid,
	"subject" "photo_subject" NOT NULL,
	"object_key" text NOT NULL,
	"thumbnail_key" text NOT NULL,
	"content_type" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" integer NOT NULL,
	"caption" text,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "devices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"name" text NOT NULL,
	"token_hash" text NOT NULL,
	"token_hint" text NOT NULL,
	"last_seen_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "readings" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "readings_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
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
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tank_limits" (
	"tank_id" uuid NOT NULL,
	"parameter" "parameter_key" NOT NULL,
	"warn_low" double precision,
	"warn_high" double precision,
	"crit_low" double precision,
	"crit_high" double precision,
	"updated_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "tank_limits_tank_id_parameter_pk" PRIMARY KEY("tank_id","parameter")
);
--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "water_type" "water_type" DEFAULT 'marine' NOT NULL;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "style" "tank_style" DEFAULT 'mixed-reef' NOT NULL;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "display_volume_l" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "sump_volume_l" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "length_cm" double precision;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "width_cm" double precision;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "height_cm" double precision;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "set_up_on" date;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "assigned_technician_id" uuid;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "service_interval_days" integer DEFAULT 14 NOT NULL;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "notes" text;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "cover_photo_id" uuid;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "time_zone" text;--> statement-breakpoint
ALTER TABLE "equipment" ADD CONSTRAINT "equipment_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "equipment" ADD CONSTRAINT "equipment_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "company_species" ADD CONSTRAINT "company_species_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "livestock" ADD CONSTRAINT "livestock_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "livestock" ADD CONSTRAINT "livestock_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "livestock" ADD CONSTRAINT "livestock_company_species_id_company_species_id_fk" FOREIGN KEY ("company_species_id") REFERENCES "public"."company_species"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "livestock_status_events" ADD CONSTRAINT "livestock_status_events_livestock_id_livestock_id_fk" FOREIGN KEY ("livestock_id") REFERENCES "public"."livestock"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "livestock_status_events" ADD CONSTRAINT "livestock_status_events_changed_by_users_id_fk" FOREIGN KEY ("changed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_livestock_id_livestock_id_fk" FOREIGN KEY ("livestock_id") REFERENCES "public"."livestock"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "devices" ADD CONSTRAINT "devices_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "devices" ADD CONSTRAINT "devices_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "devices" ADD CONSTRAINT "devices_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_device_id_devices_id_fk" FOREIGN KEY ("device_id") REFERENCES "public"."devices"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tank_limits" ADD CONSTRAINT "tank_limits_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tank_limits" ADD CONSTRAINT "tank_limits_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "equipment_tank_idx" ON "equipment" USING btree ("tank_id");--> statement-breakpoint
CREATE UNIQUE INDEX "company_species_name_key" ON "company_species" USING btree ("company_id","scientific_name");--> statement-breakpoint
CREATE INDEX "livestock_tank_idx" ON "livestock" USING btree ("tank_id");--> statement-breakpoint
CREATE INDEX "livestock_status_events_livestock_idx" ON "livestock_status_events" USING btree ("livestock_id","changed_at");--> statement-breakpoint
CREATE INDEX "photos_tank_idx" ON "photos" USING btree ("tank_id");--> statement-breakpoint
CREATE INDEX "photos_livestock_idx" ON "photos" USING btree ("livestock_id");--> statement-breakpoint
CREATE UNIQUE INDEX "devices_token_key" ON "devices" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "devices_tank_idx" ON "devices" USING btree ("tank_id");--> statement-breakpoint
CREATE INDEX "readings_history_idx" ON "readings" USING btree ("tank_id","parameter","measured_at");--> statement-breakpoint
CREATE UNIQUE INDEX "readings_device_key" ON "readings" USING btree ("device_id","parameter","measured_at") WHERE "readings"."device_id" is not null;--> statement-breakpoint
ALTER TABLE "tanks" ADD CONSTRAINT "tanks_assigned_technician_id_users_id_fk" FOREIGN KEY ("assigned_technician_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tanks" ADD CONSTRAINT "tanks_cover_photo_id_photos_id_fk" FOREIGN KEY ("cover_photo_id") REFERENCES "public"."photos"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "tanks_technician_idx" ON "tanks" USING btree ("assigned_technician_id");
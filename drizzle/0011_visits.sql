CREATE TYPE "public"."photo_phase" AS ENUM('before', 'after');--> statement-breakpoint
CREATE TYPE "public"."visit_kind" AS ENUM('routine', 'aquascaping', 'equipment', 'livestock', 'installation', 'urgent');--> statement-breakpoint
CREATE TYPE "public"."visit_status" AS ENUM('scheduled', 'in-progress', 'published', 'cancelled');--> statement-breakpoint
CREATE TABLE "visit_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"from_visit_id" uuid NOT NULL,
	"text" text NOT NULL,
	"opened_at" timestamp with time zone NOT NULL,
	"closed_in_visit_id" uuid,
	"closed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "visit_photos" (
	"visit_id" uuid NOT NULL,
	"photo_id" uuid NOT NULL,
	"phase" "photo_phase" NOT NULL,
	"published" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "visit_photos_visit_id_photo_id_pk" PRIMARY KEY("visit_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "visit_report_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"content" jsonb NOT NULL,
	"published_at" timestamp with time zone NOT NULL,
	"published_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "visit_series" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"technician_id" uuid,
	"rrule" text NOT NULL,
	"first_day" date NOT NULL,
	"start_time" text NOT NULL,
	"end_time" text NOT NULL,
	"written_until" date NOT NULL,
	"ended_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "visits" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"series_id" uuid,
	"occurrence_day" date,
	"technician_id" uuid,
	"kind" "visit_kind" NOT NULL,
	"status" "visit_status" DEFAULT 'scheduled' NOT NULL,
	"window_start" timestamp with time zone NOT NULL,
	"window_end" timestamp with time zone NOT NULL,
	"note" text,
	"draft" jsonb,
	"version" integer DEFAULT 0 NOT NULL,
	"published" jsonb,
	"published_version" integer,
	"published_at" timestamp with time zone,
	"published_by" uuid,
	"edited_at" timestamp with time zone,
	"announced_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "visits_window_order" CHECK ("visits"."window_end" > "visits"."window_start")
);
--> statement-breakpoint
ALTER TABLE "deliveries" ALTER COLUMN "alert_event_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "deliveries" ADD COLUMN "visit_id" uuid;--> statement-breakpoint
ALTER TABLE "notifications" ADD COLUMN "visit_id" uuid;--> statement-breakpoint
ALTER TABLE "tanks" ADD COLUMN "last_visit_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "calendar_token_hash" text;--> statement-breakpoint
ALTER TABLE "visit_items" ADD CONSTRAINT "visit_items_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_items" ADD CONSTRAINT "visit_items_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_items" ADD CONSTRAINT "visit_items_from_visit_id_visits_id_fk" FOREIGN KEY ("from_visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_items" ADD CONSTRAINT "visit_items_closed_in_visit_id_visits_id_fk" FOREIGN KEY ("closed_in_visit_id") REFERENCES "public"."visits"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_photos" ADD CONSTRAINT "visit_photos_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_photos" ADD CONSTRAINT "visit_photos_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_report_versions" ADD CONSTRAINT "visit_report_versions_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_report_versions" ADD CONSTRAINT "visit_report_versions_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_series" ADD CONSTRAINT "visit_series_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_series" ADD CONSTRAINT "visit_series_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_series" ADD CONSTRAINT "visit_series_technician_id_users_id_fk" FOREIGN KEY ("technician_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_series_id_visit_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."visit_series"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_technician_id_users_id_fk" FOREIGN KEY ("technician_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "visit_items_tank_idx" ON "visit_items" USING btree ("tank_id","opened_at");--> statement-breakpoint
CREATE INDEX "visit_photos_photo_idx" ON "visit_photos" USING btree ("photo_id");--> statement-breakpoint
CREATE UNIQUE INDEX "visit_report_versions_key" ON "visit_report_versions" USING btree ("visit_id","version");--> statement-breakpoint
CREATE INDEX "visit_series_tank_idx" ON "visit_series" USING btree ("tank_id");--> statement-breakpoint
CREATE INDEX "visits_company_window_idx" ON "visits" USING btree ("company_id","window_start");--> statement-breakpoint
CREATE INDEX "visits_technician_window_idx" ON "visits" USING btree ("technician_id","window_start");--> statement-breakpoint
CREATE INDEX "visits_tank_window_idx" ON "visits" USING btree ("tank_id","window_start");--> statement-breakpoint
CREATE UNIQUE INDEX "visits_series_day_key" ON "visits" USING btree ("series_id","occurrence_day");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "deliveries_visit_once_key" ON "deliveries" USING btree ("visit_id","channel","destination");--> statement-breakpoint
CREATE UNIQUE INDEX "notifications_visit_once_key" ON "notifications" USING btree ("user_id","visit_id");--> statement-breakpoint
CREATE UNIQUE INDEX "users_calendar_token_key" ON "users" USING btree ("calendar_token_hash");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_one_subject" CHECK (("deliveries"."alert_event_id" is null) <> ("deliveries"."visit_id" is null));
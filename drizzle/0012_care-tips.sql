CREATE TYPE "public"."tip_category" AS ENUM('maintenance', 'livestock', 'equipment', 'safety', 'seasonal');--> statement-breakpoint
CREATE TYPE "public"."tip_status" AS ENUM('draft', 'scheduled', 'sent', 'withdrawn');--> statement-breakpoint
CREATE TABLE "care_tip_helpful" (
	"tip_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "care_tip_helpful_tip_id_user_id_pk" PRIMARY KEY("tip_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "care_tip_readers" (
	"tip_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "care_tip_readers_tip_id_tank_id_user_id_pk" PRIMARY KEY("tip_id","tank_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "care_tip_tanks" (
	"tip_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"delivered_at" timestamp with time zone NOT NULL,
	"sent_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "care_tip_tanks_tip_id_tank_id_pk" PRIMARY KEY("tip_id","tank_id")
);
--> statement-breakpoint
CREATE TABLE "care_tips" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"title" text NOT NULL,
	"body" text NOT NULL,
	"category" "tip_category" NOT NULL,
	"photo_id" uuid,
	"audience" jsonb NOT NULL,
	"suggest_when" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"status" "tip_status" DEFAULT 'draft' NOT NULL,
	"send_at" timestamp with time zone,
	"sent_at" timestamp with time zone,
	"withdrawn_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "deliveries" DROP CONSTRAINT "deliveries_one_subject";--> statement-breakpoint
ALTER TABLE "deliveries" ADD COLUMN "tip_id" uuid;--> statement-breakpoint
ALTER TABLE "notifications" ADD COLUMN "tip_id" uuid;--> statement-breakpoint
ALTER TABLE "care_tip_helpful" ADD CONSTRAINT "care_tip_helpful_tip_id_care_tips_id_fk" FOREIGN KEY ("tip_id") REFERENCES "public"."care_tips"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tip_helpful" ADD CONSTRAINT "care_tip_helpful_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tip_readers" ADD CONSTRAINT "care_tip_readers_tip_id_care_tips_id_fk" FOREIGN KEY ("tip_id") REFERENCES "public"."care_tips"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tip_readers" ADD CONSTRAINT "care_tip_readers_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tip_readers" ADD CONSTRAINT "care_tip_readers_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tip_tanks" ADD CONSTRAINT "care_tip_tanks_tip_id_care_tips_id_fk" FOREIGN KEY ("tip_id") REFERENCES "public"."care_tips"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tip_tanks" ADD CONSTRAINT "care_tip_tanks_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tip_tanks" ADD CONSTRAINT "care_tip_tanks_sent_by_users_id_fk" FOREIGN KEY ("sent_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tips" ADD CONSTRAINT "care_tips_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tips" ADD CONSTRAINT "care_tips_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_tips" ADD CONSTRAINT "care_tips_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "care_tip_readers_user_idx" ON "care_tip_readers" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "care_tip_tanks_tank_idx" ON "care_tip_tanks" USING btree ("tank_id","delivered_at");--> statement-breakpoint
CREATE INDEX "care_tips_company_idx" ON "care_tips" USING btree ("company_id","created_at");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_tip_id_care_tips_id_fk" FOREIGN KEY ("tip_id") REFERENCES "public"."care_tips"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_tip_id_care_tips_id_fk" FOREIGN KEY ("tip_id") REFERENCES "public"."care_tips"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "deliveries_tip_once_key" ON "deliveries" USING btree ("tip_id","channel","destination");--> statement-breakpoint
CREATE UNIQUE INDEX "notifications_tip_once_key" ON "notifications" USING btree ("user_id","tip_id");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_one_subject" CHECK (num_nonnulls("deliveries"."alert_event_id", "deliveries"."visit_id", "deliveries"."tip_id") = 1);
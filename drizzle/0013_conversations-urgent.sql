CREATE TYPE "public"."message_kind" AS ENUM('message', 'internal-note');--> statement-breakpoint
CREATE TYPE "public"."message_side" AS ENUM('owner', 'staff');--> statement-breakpoint
CREATE TYPE "public"."urgent_category" AS ENUM('leak', 'power', 'equipment', 'temperature', 'livestock', 'other');--> statement-breakpoint
CREATE TYPE "public"."urgent_event_type" AS ENUM('requested', 'acknowledged', 'assigned', 'on-the-way', 'on-site', 'resolved', 'declined', 'escalated');--> statement-breakpoint
CREATE TYPE "public"."urgent_status" AS ENUM('requested', 'acknowledged', 'assigned', 'on-the-way', 'on-site', 'resolved', 'declined');--> statement-breakpoint
CREATE TABLE "conversation_messages" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"conversation_id" uuid NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"kind" "message_kind" NOT NULL,
	"side" "message_side" NOT NULL,
	"author_id" uuid,
	"author_name" text NOT NULL,
	"body" text NOT NULL,
	"urgent_request_id" uuid,
	"client_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "conversation_messages_body_length" CHECK (char_length("conversation_messages"."body") between 1 and 4000),
	CONSTRAINT "conversation_messages_notes_are_staff" CHECK ("conversation_messages"."kind" = 'message' or "conversation_messages"."side" = 'staff')
);
--> statement-breakpoint
CREATE TABLE "conversation_reads" (
	"conversation_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"read_through" timestamp with time zone,
	"emailed_through" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "conversation_reads_conversation_id_user_id_pk" PRIMARY KEY("conversation_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "conversations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"last_activity_at" timestamp with time zone,
	"last_public_at" timestamp with time zone,
	"awaiting_reply_since" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "message_photos" (
	"message_id" uuid NOT NULL,
	"photo_id" uuid NOT NULL,
	"position" integer NOT NULL,
	CONSTRAINT "message_photos_message_id_photo_id_pk" PRIMARY KEY("message_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "urgent_request_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"request_id" uuid NOT NULL,
	"type" "urgent_event_type" NOT NULL,
	"actor_id" uuid,
	"actor_name" text,
	"note" text DEFAULT '' NOT NULL,
	"eta" timestamp with time zone,
	"at" timestamp with time zone NOT NULL,
	"fanned_out_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "urgent_request_photos" (
	"request_id" uuid NOT NULL,
	"photo_id" uuid NOT NULL,
	"position" integer NOT NULL,
	CONSTRAINT "urgent_request_photos_request_id_photo_id_pk" PRIMARY KEY("request_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "urgent_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"requested_by" uuid,
	"requested_by_name" text NOT NULL,
	"category" "urgent_category" NOT NULL,
	"equipment_id" uuid,
	"description" text NOT NULL,
	"someone_on_site" boolean NOT NULL,
	"access" text DEFAULT '' NOT NULL,
	"phone" text NOT NULL,
	"best_time" text DEFAULT '' NOT NULL,
	"status" "urgent_status" DEFAULT 'requested' NOT NULL,
	"eta" timestamp with time zone,
	"technician_id" uuid,
	"decline_reason" text,
	"advice" text,
	"visit_id" uuid,
	"call_out_fee_cents" integer,
	"currency" text DEFAULT 'EUR' NOT NULL,
	"snapshot" jsonb NOT NULL,
	"escalation_level" integer DEFAULT 0 NOT NULL,
	"acknowledged_at" timestamp with time zone,
	"closed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "urgent_settings" (
	"company_id" uuid PRIMARY KEY NOT NULL,
	"ack_target_minutes" integer DEFAULT 30 NOT NULL,
	"call_out_fee_cents" integer,
	"currency" text DEFAULT 'EUR' NOT NULL,
	"first_aid" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "deliveries" DROP CONSTRAINT "deliveries_one_subject";--> statement-breakpoint
ALTER TABLE "deliveries" ADD COLUMN "message_id" uuid;--> statement-breakpoint
ALTER TABLE "deliveries" ADD COLUMN "urgent_event_id" uuid;--> statement-breakpoint
ALTER TABLE "notifications" ADD COLUMN "conversation_id" uuid;--> statement-breakpoint
ALTER TABLE "notifications" ADD COLUMN "urgent_event_id" uuid;--> statement-breakpoint
ALTER TABLE "conversation_messages" ADD CONSTRAINT "conversation_messages_conversation_id_conversations_id_fk" FOREIGN KEY ("conversation_id") REFERENCES "public"."conversations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversation_messages" ADD CONSTRAINT "conversation_messages_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversation_messages" ADD CONSTRAINT "conversation_messages_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversation_messages" ADD CONSTRAINT "conversation_messages_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversation_messages" ADD CONSTRAINT "conversation_messages_urgent_request_id_urgent_requests_id_fk" FOREIGN KEY ("urgent_request_id") REFERENCES "public"."urgent_requests"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversation_reads" ADD CONSTRAINT "conversation_reads_conversation_id_conversations_id_fk" FOREIGN KEY ("conversation_id") REFERENCES "public"."conversations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversation_reads" ADD CONSTRAINT "conversation_reads_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversations" ADD CONSTRAINT "conversations_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conversations" ADD CONSTRAINT "conversations_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "message_photos" ADD CONSTRAINT "message_photos_message_id_conversation_messages_id_fk" FOREIGN KEY ("message_id") REFERENCES "public"."conversation_messages"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "message_photos" ADD CONSTRAINT "message_photos_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_request_events" ADD CONSTRAINT "urgent_request_events_request_id_urgent_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."urgent_requests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_request_events" ADD CONSTRAINT "urgent_request_events_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_request_photos" ADD CONSTRAINT "urgent_request_photos_request_id_urgent_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."urgent_requests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_request_photos" ADD CONSTRAINT "urgent_request_photos_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_requests" ADD CONSTRAINT "urgent_requests_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_requests" ADD CONSTRAINT "urgent_requests_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_requests" ADD CONSTRAINT "urgent_requests_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_requests" ADD CONSTRAINT "urgent_requests_equipment_id_equipment_id_fk" FOREIGN KEY ("equipment_id") REFERENCES "public"."equipment"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_requests" ADD CONSTRAINT "urgent_requests_technician_id_users_id_fk" FOREIGN KEY ("technician_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_requests" ADD CONSTRAINT "urgent_requests_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "urgent_settings" ADD CONSTRAINT "urgent_settings_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "conversation_messages_page_idx" ON "conversation_messages" USING btree ("conversation_id","created_at","id");--> statement-breakpoint
CREATE UNIQUE INDEX "conversation_messages_client_key" ON "conversation_messages" USING btree ("author_id","client_key");--> statement-breakpoint
CREATE INDEX "conversation_reads_user_idx" ON "conversation_reads" USING btree ("user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "conversations_tank_key" ON "conversations" USING btree ("tank_id");--> statement-breakpoint
CREATE INDEX "conversations_inbox_idx" ON "conversations" USING btree ("company_id","awaiting_reply_since","last_activity_at");--> statement-breakpoint
CREATE INDEX "message_photos_photo_idx" ON "message_photos" USING btree ("photo_id");--> statement-breakpoint
CREATE INDEX "urgent_request_events_request_idx" ON "urgent_request_events" USING btree ("request_id","at");--> statement-breakpoint
CREATE INDEX "urgent_request_photos_photo_idx" ON "urgent_request_photos" USING btree ("photo_id");--> statement-breakpoint
CREATE INDEX "urgent_requests_board_idx" ON "urgent_requests" USING btree ("company_id","status","created_at");--> statement-breakpoint
CREATE INDEX "urgent_requests_tank_idx" ON "urgent_requests" USING btree ("tank_id","created_at");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_message_id_conversation_messages_id_fk" FOREIGN KEY ("message_id") REFERENCES "public"."conversation_messages"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_urgent_event_id_urgent_request_events_id_fk" FOREIGN KEY ("urgent_event_id") REFERENCES "public"."urgent_request_events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_conversation_id_conversations_id_fk" FOREIGN KEY ("conversation_id") REFERENCES "public"."conversations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_urgent_event_id_urgent_request_events_id_fk" FOREIGN KEY ("urgent_event_id") REFERENCES "public"."urgent_request_events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "deliveries_message_once_key" ON "deliveries" USING btree ("message_id","channel","destination");--> statement-breakpoint
CREATE UNIQUE INDEX "deliveries_urgent_once_key" ON "deliveries" USING btree ("urgent_event_id","channel","destination");--> statement-breakpoint
CREATE UNIQUE INDEX "notifications_conversation_key" ON "notifications" USING btree ("user_id","conversation_id");--> statement-breakpoint
CREATE UNIQUE INDEX "notifications_urgent_once_key" ON "notifications" USING btree ("user_id","urgent_event_id");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_one_subject" CHECK (num_nonnulls("deliveries"."alert_event_id", "deliveries"."visit_id", "deliveries"."tip_id", "deliveries"."message_id", "deliveries"."urgent_event_id") = 1);
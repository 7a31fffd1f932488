CREATE TYPE "public"."invoice_event_type" AS ENUM('issued', 'paid', 'reminder-7', 'reminder-14');--> statement-breakpoint
CREATE TYPE "public"."invoice_kind" AS ENUM('invoice', 'credit-note');--> statement-breakpoint
CREATE TYPE "public"."invoice_line_kind" AS ENUM('service', 'labour', 'call-out', 'consumable', 'part', 'other');--> statement-breakpoint
CREATE TYPE "public"."invoice_status" AS ENUM('draft', 'issued', 'overdue', 'paid', 'void');--> statement-breakpoint
CREATE TYPE "public"."payment_method" AS ENUM('card-online', 'bank-transfer', 'cash', 'card-in-person');--> statement-breakpoint
CREATE TYPE "public"."price_item_kind" AS ENUM('routine', 'consumable', 'part');--> statement-breakpoint
ALTER TYPE "public"."audit_action" ADD VALUE 'billing-settings.changed';--> statement-breakpoint
ALTER TYPE "public"."audit_action" ADD VALUE 'invoice.issued';--> statement-breakpoint
ALTER TYPE "public"."audit_action" ADD VALUE 'invoice.voided';--> statement-breakpoint
ALTER TYPE "public"."audit_action" ADD VALUE 'invoice.credited';--> statement-breakpoint
ALTER TYPE "public"."audit_action" ADD VALUE 'invoice.payment-recorded';--> statement-breakpoint
ALTER TYPE "public"."audit_target_kind" ADD VALUE 'invoice';--> statement-breakpoint
CREATE TABLE "billing_counters" (
	"company_id" uuid NOT NULL,
	"kind" "invoice_kind" NOT NULL,
	"last_number" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "billing_counters_company_id_kind_pk" PRIMARY KEY("company_id","kind")
);
--> statement-breakpoint
CREATE TABLE "billing_settings" (
	"company_id" uuid PRIMARY KEY NOT NULL,
	"currency" text DEFAULT 'EUR' NOT NULL,
	"tax_rate_bp" integer DEFAULT 0 NOT NULL,
	"tax_label" text DEFAULT 'VAT' NOT NULL,
	"prices_include_tax" boolean DEFAULT true NOT NULL,
	"payment_terms_days" integer DEFAULT 14 NOT NULL,
	"hourly_rate_minor" integer,
	"call_out_fee_minor" integer,
	"seller_name" text DEFAULT '' NOT NULL,
	"seller_address" text DEFAULT '' NOT NULL,
	"seller_tax_id" text DEFAULT '' NOT NULL,
	"invoice_footer" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "billing_settings_tax_rate" CHECK ("billing_settings"."tax_rate_bp" between 0 and 10000),
	CONSTRAINT "billing_settings_terms" CHECK ("billing_settings"."payment_terms_days" between 0 and 120),
	CONSTRAINT "billing_settings_amounts" CHECK (coalesce("billing_settings"."hourly_rate_minor", 0) >= 0 and coalesce("billing_settings"."call_out_fee_minor", 0) >= 0)
);
--> statement-breakpoint
CREATE TABLE "checkout_sessions" (
	"id" text PRIMARY KEY NOT NULL,
	"company_id" uuid NOT NULL,
	"invoice_id" uuid NOT NULL,
	"amount_minor" integer NOT NULL,
	"currency" text NOT NULL,
	"url" text NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "invoice_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"invoice_id" uuid NOT NULL,
	"type" "invoice_event_type" NOT NULL,
	"announced_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "invoice_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"invoice_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"kind" "invoice_line_kind" NOT NULL,
	"description" text NOT NULL,
	"quantity_hundredths" integer NOT NULL,
	"unit" text DEFAULT '' NOT NULL,
	"unit_price_minor" integer NOT NULL,
	"amount_minor" integer NOT NULL,
	"price_item_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invoice_lines_quantity" CHECK ("invoice_lines"."quantity_hundredths" > 0)
);
--> statement-breakpoint
CREATE TABLE "invoices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"kind" "invoice_kind" DEFAULT 'invoice' NOT NULL,
	"status" "invoice_status" DEFAULT 'draft' NOT NULL,
	"number" integer,
	"credited_invoice_id" uuid,
	"source_visit_id" uuid,
	"source_urgent_request_id" uuid,
	"bill_to_user_id" uuid,
	"bill_to_name" text DEFAULT '' NOT NULL,
	"bill_to_email" text DEFAULT '' NOT NULL,
	"currency" text NOT NULL,
	"tax_rate_bp" integer NOT NULL,
	"tax_label" text NOT NULL,
	"prices_include_tax" boolean NOT NULL,
	"net_minor" integer DEFAULT 0 NOT NULL,
	"tax_minor" integer DEFAULT 0 NOT NULL,
	"total_minor" integer DEFAULT 0 NOT NULL,
	"paid_minor" integer DEFAULT 0 NOT NULL,
	"credited_minor" integer DEFAULT 0 NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"seller" jsonb,
	"issue_date" date,
	"due_date" date,
	"issued_at" timestamp with time zone,
	"issued_by" uuid,
	"paid_at" timestamp with time zone,
	"voided_at" timestamp with time zone,
	"reason" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invoices_numbered_when_issued" CHECK (("invoices"."status" = 'draft') = ("invoices"."number" is null)),
	CONSTRAINT "invoices_credit_note_names_invoice" CHECK (("invoices"."kind" = 'credit-note') = ("invoices"."credited_invoice_id" is not null)),
	CONSTRAINT "invoices_sign" CHECK (case when "invoices"."kind" = 'invoice' then "invoices"."total_minor" >= 0 else "invoices"."total_minor" <= 0 end)
);
--> statement-breakpoint
CREATE TABLE "payment_events" (
	"id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"occurred_at" timestamp with time zone NOT NULL,
	"checkout_session_id" text,
	"invoice_id" uuid,
	"outcome" text NOT NULL,
	"payload" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "payments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"invoice_id" uuid NOT NULL,
	"method" "payment_method" NOT NULL,
	"amount_minor" integer NOT NULL,
	"currency" text NOT NULL,
	"received_at" timestamp with time zone NOT NULL,
	"checkout_session_id" text,
	"provider_payment_id" text,
	"reference" text DEFAULT '' NOT NULL,
	"recorded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "payments_amount" CHECK ("payments"."amount_minor" > 0)
);
--> statement-breakpoint
CREATE TABLE "price_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"kind" "price_item_kind" NOT NULL,
	"name" text NOT NULL,
	"unit" text NOT NULL,
	"unit_price_minor" integer NOT NULL,
	"up_to_litres" integer,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "price_items_price" CHECK ("price_items"."unit_price_minor" >= 0)
);
--> statement-breakpoint
ALTER TABLE "deliveries" DROP CONSTRAINT "deliveries_one_subject";--> statement-breakpoint
ALTER TABLE "deliveries" ADD COLUMN "invoice_event_id" uuid;--> statement-breakpoint
ALTER TABLE "notifications" ADD COLUMN "invoice_event_id" uuid;--> statement-breakpoint
ALTER TABLE "billing_counters" ADD CONSTRAINT "billing_counters_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "billing_settings" ADD CONSTRAINT "billing_settings_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checkout_sessions" ADD CONSTRAINT "checkout_sessions_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checkout_sessions" ADD CONSTRAINT "checkout_sessions_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checkout_sessions" ADD CONSTRAINT "checkout_sessions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_events" ADD CONSTRAINT "invoice_events_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_lines" ADD CONSTRAINT "invoice_lines_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_lines" ADD CONSTRAINT "invoice_lines_price_item_id_price_items_id_fk" FOREIGN KEY ("price_item_id") REFERENCES "public"."price_items"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_credited_invoice_id_invoices_id_fk" FOREIGN KEY ("credited_invoice_id") REFERENCES "public"."invoices"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_source_visit_id_visits_id_fk" FOREIGN KEY ("source_visit_id") REFERENCES "public"."visits"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_source_urgent_request_id_urgent_requests_id_fk" FOREIGN KEY ("source_urgent_request_id") REFERENCES "public"."urgent_requests"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_bill_to_user_id_users_id_fk" FOREIGN KEY ("bill_to_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_issued_by_users_id_fk" FOREIGN KEY ("issued_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment_events" ADD CONSTRAINT "payment_events_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_items" ADD CONSTRAINT "price_items_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "checkout_sessions_invoice_idx" ON "checkout_sessions" USING btree ("invoice_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "invoice_events_once_key" ON "invoice_events" USING btree ("invoice_id","type");--> statement-breakpoint
CREATE INDEX "invoice_events_unannounced_idx" ON "invoice_events" USING btree ("created_at") WHERE "invoice_events"."announced_at" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "invoice_lines_position_key" ON "invoice_lines" USING btree ("invoice_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "invoices_number_key" ON "invoices" USING btree ("company_id","kind","number");--> statement-breakpoint
CREATE UNIQUE INDEX "invoices_visit_key" ON "invoices" USING btree ("source_visit_id") WHERE "invoices"."kind" = 'invoice' and "invoices"."status" <> 'void';--> statement-breakpoint
CREATE UNIQUE INDEX "invoices_urgent_key" ON "invoices" USING btree ("source_urgent_request_id") WHERE "invoices"."kind" = 'invoice' and "invoices"."status" <> 'void';--> statement-breakpoint
CREATE INDEX "invoices_company_status_idx" ON "invoices" USING btree ("company_id","status","issue_date");--> statement-breakpoint
CREATE INDEX "invoices_tank_idx" ON "invoices" USING btree ("tank_id","created_at");--> statement-breakpoint
CREATE INDEX "invoices_credited_idx" ON "invoices" USING btree ("credited_invoice_id");--> statement-breakpoint
CREATE INDEX "payment_events_session_idx" ON "payment_events" USING btree ("checkout_session_id");--> statement-breakpoint
CREATE INDEX "payments_invoice_idx" ON "payments" USING btree ("invoice_id");--> statement-breakpoint
CREATE INDEX "payments_company_received_idx" ON "payments" USING btree ("company_id","received_at");--> statement-breakpoint
CREATE UNIQUE INDEX "payments_session_key" ON "payments" USING btree ("checkout_session_id");--> statement-breakpoint
CREATE INDEX "price_items_company_idx" ON "price_items" USING btree ("company_id","kind");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_invoice_event_id_invoice_events_id_fk" FOREIGN KEY ("invoice_event_id") REFERENCES "public"."invoice_events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_invoice_event_id_invoice_events_id_fk" FOREIGN KEY ("invoice_event_id") REFERENCES "public"."invoice_events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "deliveries_invoice_once_key" ON "deliveries" USING btree ("invoice_event_id","channel","destination");--> statement-breakpoint
CREATE UNIQUE INDEX "notifications_invoice_once_key" ON "notifications" USING btree ("user_id","invoice_event_id");--> statement-breakpoint
ALTER TABLE "deliveries" ADD CONSTRAINT "deliveries_one_subject" CHECK (num_nonnulls("deliveries"."alert_event_id", "deliveries"."visit_id", "deliveries"."tip_id", "deliveries"."message_id", "deliveries"."urgent_event_id", "deliveries"."invoice_event_id") = 1);
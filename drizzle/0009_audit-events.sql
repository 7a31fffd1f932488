CREATE TYPE "public"."audit_action" AS ENUM('sign-in.succeeded', 'sign-in.failed', 'user.role-changed', 'user.deactivated', 'user.reactivated', 'invitation.sent', 'invitation.accepted', 'invitation.revoked', 'device.created', 'device.revoked', 'limits.changed', 'readings.exported', 'photo.deleted');--> statement-breakpoint
CREATE TYPE "public"."audit_target_kind" AS ENUM('user', 'invitation', 'device', 'tank', 'photo');--> statement-breakpoint
CREATE TABLE "audit_events" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "audit_events_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"company_id" uuid NOT NULL,
	"actor_id" uuid,
	"actor_name" text,
	"actor_email" text,
	"action" "audit_action" NOT NULL,
	"target_kind" "audit_target_kind",
	"target_id" text,
	"target_label" text,
	"at" timestamp with time zone NOT NULL,
	"ip" "inet",
	"user_agent" text,
	"request_id" text,
	"before" jsonb,
	"after" jsonb,
	"details" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "audit_events_company_idx" ON "audit_events" USING btree ("company_id","at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "audit_events_action_idx" ON "audit_events" USING btree ("company_id","action","at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "audit_events_at_idx" ON "audit_events" USING btree ("at");
CREATE TABLE "tank_status" (
	"tank_id" uuid PRIMARY KEY NOT NULL,
	"company_id" uuid NOT NULL,
	"status" text NOT NULL,
	"rank" integer NOT NULL,
	"reason" text NOT NULL,
	"since" timestamp with time zone NOT NULL,
	"judged_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
ALTER TABLE "tank_status" ADD CONSTRAINT "tank_status_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tank_status" ADD CONSTRAINT "tank_status_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "tank_status_order_idx" ON "tank_status" USING btree ("company_id","rank","since","tank_id");--> statement-breakpoint
CREATE INDEX "tank_status_judged_idx" ON "tank_status" USING btree ("judged_at");
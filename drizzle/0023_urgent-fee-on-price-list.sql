ALTER TABLE "urgent_settings" DROP COLUMN "call_out_fee_cents";--> statement-breakpoint
ALTER TABLE "urgent_settings" DROP COLUMN "currency";
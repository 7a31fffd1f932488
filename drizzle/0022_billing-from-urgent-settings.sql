-- The call-out fee and the currency move from the urgent-visit settings to the company's billing
-- settings (the price list), which now own every price; companies keep what they had set.
INSERT INTO "billing_settings" ("company_id", "currency", "call_out_fee_minor")
SELECT "company_id", "currency", "call_out_fee_cents" FROM "urgent_settings"
ON CONFLICT ("company_id") DO NOTHING;

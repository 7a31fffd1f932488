ALTER TABLE "readings" DROP CONSTRAINT "readings_company_id_companies_id_fk";
--> statement-breakpoint

-- The same function in PL/pgSQL: a SQL-language function is planned again at every statement that
-- calls it, and a plan over every month's partition costs a few milliseconds, paid by each batch
-- of device readings (its trigger calls this). PL/pgSQL keeps the plan for the session.
CREATE OR REPLACE FUNCTION reading_device_moments(p_device uuid, p_parameter parameter_key, p_until timestamptz)
RETURNS timestamptz[] LANGUAGE plpgsql STABLE AS $$
BEGIN
  RETURN array(
    SELECT d.measured_at FROM readings d
    WHERE d.device_id = p_device AND d.parameter = p_parameter AND d.measured_at <= p_until
    ORDER BY d.measured_at DESC
    LIMIT 11);
END
$$;

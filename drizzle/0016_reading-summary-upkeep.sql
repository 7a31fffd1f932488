-- Upkeep of latest_readings and the hourly and daily rollups, inside the statement that writes
-- readings, whoever writes them (ingest, people, the seed, tests). Buckets use the chart's grid
-- origin (shared/readings/buckets.ts bucketOrigin), a Monday at 00:00 UTC.

-- The device behind a latest reading: its last 11 report times up to and including that reading
-- (shared/alerts/stale-device.ts reportingGapsSampled + 1), newest first.
CREATE FUNCTION reading_device_moments(p_device uuid, p_parameter parameter_key, p_until timestamptz)
RETURNS timestamptz[] LANGUAGE sql STABLE AS $$
  SELECT array(
    SELECT d.measured_at FROM readings d
    WHERE d.device_id = p_device AND d.parameter = p_parameter AND d.measured_at <= p_until
    ORDER BY d.measured_at DESC
    LIMIT 11)
$$;
--> statement-breakpoint

-- New readings fold into the summaries: min, max, sums and counts add up, the newest wins.
CREATE FUNCTION reading_summaries_after_insert() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO reading_rollups_hourly AS r
    (tank_id, parameter, bucket_start, min, max, sum, count, device_count, home_count, visit_count, last_value, last_at)
  SELECT n.tank_id, n.parameter, date_bin('1 hour', n.measured_at, timestamptz '2000-01-03 00:00:00+00') AS b,
    min(n.value), max(n.value), sum(n.value), count(*)::int,
    (count(*) FILTER (WHERE n.source = 'device'))::int,
    (count(*) FILTER (WHERE n.source = 'home-test'))::int,
    (count(*) FILTER (WHERE n.source = 'visit'))::int,
    (array_agg(n.value ORDER BY n.measured_at DESC, n.id DESC))[1], max(n.measured_at)
  FROM new_rows n
  GROUP BY n.tank_id, n.parameter, b
  ORDER BY n.tank_id, n.parameter, b
  ON CONFLICT (tank_id, parameter, bucket_start) DO UPDATE SET
    min = least(r.min, excluded.min),
    max = greatest(r.max, excluded.max),
    sum = r.sum + excluded.sum,
    count = r.count + excluded.count,
    device_count = r.device_count + excluded.device_count,
    home_count = r.home_count + excluded.home_count,
    visit_count = r.visit_count + excluded.visit_count,
    last_value = CASE WHEN excluded.last_at >= r.last_at THEN excluded.last_value ELSE r.last_value END,
    last_at = greatest(r.last_at, excluded.last_at);

  INSERT INTO reading_rollups_daily AS r
    (tank_id, parameter, bucket_start, min, max, sum, count, device_count, home_count, visit_count, last_value, last_at)
  SELECT n.tank_id, n.parameter, date_bin('1 day', n.measured_at, timestamptz '2000-01-03 00:00:00+00') AS b,
    min(n.value), max(n.value), sum(n.value), count(*)::int,
    (count(*) FILTER (WHERE n.source = 'device'))::int,
    (count(*) FILTER (WHERE n.source = 'home-test'))::int,
    (count(*) FILTER (WHERE n.source = 'visit'))::int,
    (array_agg(n.value ORDER BY n.measured_at DESC, n.id DESC))[1], max(n.measured_at)
  FROM new_rows n
  GROUP BY n.tank_id, n.parameter, b
  ORDER BY n.tank_id, n.parameter, b
  ON CONFLICT (tank_id, parameter, bucket_start) DO UPDATE SET
    min = least(r.min, excluded.min),
    max = greatest(r.max, excluded.max),
    sum = r.sum + excluded.sum,
    count = r.count + excluded.count,
    device_count = r.device_count + excluded.device_count,
    home_count = r.home_count + excluded.home_count,
    visit_count = r.visit_count + excluded.visit_count,
    last_value = CASE WHEN excluded.last_at >= r.last_at THEN excluded.last_value ELSE r.last_value END,
    last_at = greatest(r.last_at, excluded.last_at);

  INSERT INTO latest_readings AS l (tank_id, parameter, reading_id, value, measured_at, source, device_id, device_moments)
  SELECT DISTINCT ON (n.tank_id, n.parameter)
    n.tank_id, n.parameter, n.id, n.value, n.measured_at, n.source, n.device_id, NULL::timestamptz[]
  FROM new_rows n
  ORDER BY n.tank_id, n.parameter, n.measured_at DESC, n.id DESC
  ON CONFLICT (tank_id, parameter) DO UPDATE SET
    reading_id = excluded.reading_id,
    value = excluded.value,
    measured_at = excluded.measured_at,
    source = excluded.source,
    device_id = excluded.device_id,
    device_moments = NULL
  WHERE (excluded.measured_at, excluded.reading_id) > (l.measured_at, l.reading_id);

  -- A late report of the same device changes the moments even when the latest stays.
  UPDATE latest_readings l
  SET device_moments = reading_device_moments(l.device_id, l.parameter, l.measured_at)
  FROM (SELECT DISTINCT n.tank_id, n.parameter, n.device_id FROM new_rows n WHERE n.device_id IS NOT NULL) d
  WHERE l.tank_id = d.tank_id AND l.parameter = d.parameter AND l.device_id = d.device_id;
  RETURN NULL;
END
$$;
--> statement-breakpoint

-- A pair's summaries over a span, worked out again from the readings: for corrected or removed
-- readings, and `npm run db:rebuild-rollups`. Whole buckets around the span are rebuilt.
CREATE FUNCTION rebuild_reading_summaries(p_tank uuid, p_parameter parameter_key, p_from timestamptz, p_to timestamptz)
RETURNS void LANGUAGE plpgsql AS $$
DECLARE
  origin constant timestamptz := timestamptz '2000-01-03 00:00:00+00';
  h_from timestamptz := date_bin('1 hour', p_from, origin);
  h_to timestamptz := date_bin('1 hour', p_to, origin) + interval '1 hour';
  d_from timestamptz := date_bin('1 day', p_from, origin);
  d_to timestamptz := date_bin('1 day', p_to, origin) + interval '1 day';
BEGIN
  DELETE FROM reading_rollups_hourly
  WHERE tank_id = p_tank AND parameter = p_parameter AND bucket_start >= h_from AND bucket_start < h_to;
  INSERT INTO reading_rollups_hourly
    (tank_id, parameter, bucket_start, min, max, sum, count, device_count, home_count, visit_count, last_value, last_at)
  SELECT r.tank_id, r.parameter, date_bin('1 hour', r.measured_at, origin) AS b,
    min(r.value), max(r.value), sum(r.value), count(*)::int,
    (count(*) FILTER (WHERE r.source = 'device'))::int,
    (count(*) FILTER (WHERE r.source = 'home-test'))::int,
    (count(*) FILTER (WHERE r.source = 'visit'))::int,
    (array_agg(r.value ORDER BY r.measured_at DESC, r.id DESC))[1], max(r.measured_at)
  FROM readings r
  WHERE r.tank_id = p_tank AND r.parameter = p_parameter AND r.measured_at >= h_from AND r.measured_at < h_to
  GROUP BY r.tank_id, r.parameter, b;

  DELETE FROM reading_rollups_daily
  WHERE tank_id = p_tank AND parameter = p_parameter AND bucket_start >= d_from AND bucket_start < d_to;
  INSERT INTO reading_rollups_daily
    (tank_id, parameter, bucket_start, min, max, sum, count, device_count, home_count, visit_count, last_value, last_at)
  SELECT r.tank_id, r.parameter, date_bin('1 day', r.measured_at, origin) AS b,
    min(r.value), max(r.value), sum(r.value), count(*)::int,
    (count(*) FILTER (WHERE r.source = 'device'))::int,
    (count(*) FILTER (WHERE r.source = 'home-test'))::int,
    (count(*) FILTER (WHERE r.source = 'visit'))::int,
    (array_agg(r.value ORDER BY r.measured_at DESC, r.id DESC))[1], max(r.measured_at)
  FROM readings r
  WHERE r.tank_id = p_tank AND r.parameter = p_parameter AND r.measured_at >= d_from AND r.measured_at < d_to
  GROUP BY r.tank_id, r.parameter, b;

  DELETE FROM latest_readings WHERE tank_id = p_tank AND parameter = p_parameter;
  INSERT INTO latest_readings (tank_id, parameter, reading_id, value, measured_at, source, device_id, device_moments)
  SELECT r.tank_id, r.parameter, r.id, r.value, r.measured_at, r.source, r.device_id,
    CASE WHEN r.device_id IS NOT NULL THEN reading_device_moments(r.device_id, r.parameter, r.measured_at) END
  FROM readings r
  WHERE r.tank_id = p_tank AND r.parameter = p_parameter
  ORDER BY r.measured_at DESC, r.id DESC
  LIMIT 1;
END
$$;
--> statement-breakpoint

-- Every summary from scratch, set-based: the backfill below, bulk loads and the bench seed.
CREATE FUNCTION rebuild_all_reading_summaries() RETURNS void LANGUAGE plpgsql AS $$
DECLARE
  origin constant timestamptz := timestamptz '2000-01-03 00:00:00+00';
BEGIN
  TRUNCATE reading_rollups_hourly, reading_rollups_daily, latest_readings;
  INSERT INTO reading_rollups_hourly
    (tank_id, parameter, bucket_start, min, max, sum, count, device_count, home_count, visit_count, last_value, last_at)
  SELECT r.tank_id, r.parameter, date_bin('1 hour', r.measured_at, origin) AS b,
    min(r.value), max(r.value), sum(r.value), count(*)::int,
    (count(*) FILTER (WHERE r.source = 'device'))::int,
    (count(*) FILTER (WHERE r.source = 'home-test'))::int,
    (count(*) FILTER (WHERE r.source = 'visit'))::int,
    (array_agg(r.value ORDER BY r.measured_at DESC, r.id DESC))[1], max(r.measured_at)
  FROM readings r
  GROUP BY r.tank_id, r.parameter, b;
  INSERT INTO reading_rollups_daily
    (tank_id, parameter, bucket_start, min, max, sum, count, device_count, home_count, visit_count, last_value, last_at)
  SELECT h.tank_id, h.parameter, date_bin('1 day', h.bucket_start, origin) AS b,
    min(h.min), max(h.max), sum(h.sum), sum(h.count)::int,
    sum(h.device_count)::int, sum(h.home_count)::int, sum(h.visit_count)::int,
    (array_agg(h.last_value ORDER BY h.last_at DESC))[1], max(h.last_at)
  FROM reading_rollups_hourly h
  GROUP BY h.tank_id, h.parameter, b;
  INSERT INTO latest_readings (tank_id, parameter, reading_id, value, measured_at, source, device_id, device_moments)
  SELECT x.tank_id, x.parameter, x.id, x.value, x.measured_at, x.source, x.device_id,
    CASE WHEN x.device_id IS NOT NULL THEN reading_device_moments(x.device_id, x.parameter, x.measured_at) END
  FROM (
    SELECT DISTINCT ON (r.tank_id, r.parameter) r.*
    FROM readings r
    ORDER BY r.tank_id, r.parameter, r.measured_at DESC, r.id DESC
  ) x;
END
$$;
--> statement-breakpoint

CREATE FUNCTION reading_summaries_after_delete() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM rebuild_reading_summaries(o.tank_id, o.parameter, min(o.measured_at), max(o.measured_at))
  FROM old_rows o
  WHERE EXISTS (SELECT 1 FROM tanks t WHERE t.id = o.tank_id)
  GROUP BY o.tank_id, o.parameter;
  RETURN NULL;
END
$$;
--> statement-breakpoint

CREATE FUNCTION reading_summaries_after_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM rebuild_reading_summaries(c.tank_id, c.parameter, min(c.measured_at), max(c.measured_at))
  FROM (
    SELECT o.tank_id, o.parameter, o.measured_at FROM old_rows o
    UNION ALL
    SELECT n.tank_id, n.parameter, n.measured_at FROM new_rows n
  ) c
  WHERE EXISTS (SELECT 1 FROM tanks t WHERE t.id = c.tank_id)
  GROUP BY c.tank_id, c.parameter;
  RETURN NULL;
END
$$;
--> statement-breakpoint

CREATE TRIGGER readings_summaries_insert AFTER INSERT ON readings
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION reading_summaries_after_insert();
--> statement-breakpoint
CREATE TRIGGER readings_summaries_delete AFTER DELETE ON readings
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION reading_summaries_after_delete();
--> statement-breakpoint
CREATE TRIGGER readings_summaries_update AFTER UPDATE ON readings
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION reading_summaries_after_update();
--> statement-breakpoint

SELECT rebuild_all_reading_summaries();

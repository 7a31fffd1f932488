import pg from 'pg';
import { startBenchCluster } from './support/cluster';

const cluster = await startBenchCluster({ durable: true });
const pool = new pg.Pool({ connectionString: cluster.url });
try {
  const { rows } = await pool.query(`select array_agg(id) filter (where last_seen_at is not null) as ids, array_agg(last_seen_at - interval '90 days') filter (where last_seen_at is not null) as since, count(*), count(last_seen_at) as seen from devices where revoked_at is null`);
  console.log('devices', rows[0].count, 'seen', rows[0].seen);
  const q = `explain (analyze, buffers, costs off, summary on)
    select d.id as device_id, t.at
    from unnest($1::uuid[], $2::timestamptz[]) as d(id, since)
    cross join lateral (
      select distinct m.measured_at as at
      from unnest(enum_range(null::parameter_key)) as p(parameter)
      cross join lateral (
        select r.measured_at from readings r
        where r.device_id = d.id and r.parameter = p.parameter and r.measured_at >= d.since
        order by r.measured_at desc
        limit 11
      ) m
      order by at desc
      limit 11
    ) t`;
  for (let i = 0; i < 4; i++) {
    const plan = (await pool.query(q, [rows[0].ids, rows[0].since])).rows.map((r) => r['QUERY PLAN'] as string);
    if (i === 0) console.log(plan.slice(0, 30).join('\n'));
    console.log(plan.filter((l) => /^ *Buffers/.test(l)).slice(0, 1).concat(plan.filter((l) => /Execution Time/.test(l))).join(' | '));
  }
} finally {
  await pool.end();
  await cluster.stop();
}

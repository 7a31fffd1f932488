import { statfsSync } from 'node:fs';
import pg from 'pg';
import { connectDatabase } from '../../../api/db/client';
import { applyMigrations } from '../../../api/db/migrations';
import { benchDatabase, benchDataDir, startBenchCluster } from '../support/cluster';
import {
  benchIssuer,
  benchScale,
  companyPlans,
  companySlug,
  deviceParameters,
  deviceToken,
  historyDays,
  ownersPerTank,
  personEmail,
  personSubject,
  seedVersion,
  tanksPerTechnician,
} from './plan';

/*
 * `npm run bench:seed`: the large data set the benches measure, written set-based
 * (generate_series) into the real tables, on the bench cluster with fsync off. Run twice, it
 * does nothing the second time: a `bench_seed` row records the seed version and scale. A
 * missing or different marker drops the bench database and starts over, so a seed cut short
 * is never measured.
 */

const gb = 1024 ** 3;
/** The full seed is about 3 GB with its indexes and WAL; 8 GB leaves room for the benches' writes. */
const diskNeeded = Math.max(1, 8 * benchScale) * gb;

function say(line: string) {
  console.log(`bench:seed ${new Date().toISOString().slice(11, 19)} ${line}`);
}

function checkDisk() {
  const stats = statfsSync(benchDataDir);
  const free = stats.bavail * stats.bsize;
  if (free < diskNeeded) {
    throw new Error(
      `only ${(free / gb).toFixed(1)} GB free next to ${benchDataDir}; the seed needs ${(diskNeeded / gb).toFixed(0)} GB`,
    );
  }
}

async function markerOf(baseUrl: string): Promise<{ version: number; scale: number } | null> {
  const admin = new pg.Client({ connectionString: `${baseUrl}/postgres` });
  await admin.connect();
  try {
    const exists = await admin.query('select 1 from pg_database where datname = $1', [benchDatabase]);
    if (exists.rowCount === 0) return null;
  } finally {
    await admin.end();
  }
  const client = new pg.Client({ connectionString: `${baseUrl}/${benchDatabase}` });
  await client.connect();
  try {
    const { rows } = await client
      .query<{ version: number; scale: number }>(
        `select version, scale from bench_seed where to_regclass('bench_seed') is not null limit 1`,
      )
      .catch(() => ({ rows: [] as Array<{ version: number; scale: number }> }));
    return rows[0] ?? null;
  } finally {
    await client.end();
  }
}

async function recreateDatabase(baseUrl: string) {
  const admin = new pg.Client({ connectionString: `${baseUrl}/postgres` });
  await admin.connect();
  try {
    await admin.query(`drop database if exists ${benchDatabase} with (force)`);
    await admin.query(`create database ${benchDatabase}`);
  } finally {
    await admin.end();
  }
}

async function seed(client: pg.Client) {
  const run = (text: string, values: unknown[] = []) => client.query(text, values);
  await run(`create table bench_tanks (
    tank_id uuid primary key, company text not null, n int not null, device_id uuid, device_token text,
    unique (company, n))`);
  await run(`create table bench_people (
    user_id uuid primary key, company text not null, role text not null, n int not null,
    subject text not null, email text not null, unique (company, role, n))`);
  await run(`create table bench_plan (company text primary key, slug text not null, tanks int not null,
    device_history_tanks int not null, alert_tanks int not null, home_tests boolean not null)`);
  for (const plan of companyPlans) {
    await run(`insert into bench_plan values ($1, $2, $3, $4, $5, $6)`, [
      plan.key,
      companySlug(plan.key),
      plan.tanks,
      plan.deviceHistoryTanks,
      plan.alertTanks,
      plan.homeTests,
    ]);
  }

  say('companies and people');
  await run(
    `insert into companies (slug, name, time_zone)
    select p.slug, c.name, 'Europe/London' from bench_plan p
    join (select unnest($1::text[]) as key, unnest($2::text[]) as name) c on c.key = p.company`,
    [companyPlans.map((plan) => plan.key), companyPlans.map((plan) => plan.name)],
  );
  // One admin, a technician per 50 tanks, two owners per tank; the subjects and e-mails follow
  // plan.ts so the benches can sign any of them in.
  const people = (role: string, count: string) => `
    with made as (
      select p.company, n, gen_random_uuid() as id
      from bench_plan p cross join lateral generate_series(1, ${count}) n
    ), person as (
      insert into users (id, company_id, issuer, subject, email, name, role)
      select m.id, c.id, $1, 'bench-' || m.company || '-${role}-' || m.n,
        '${role}-' || m.n || '@bench-' || m.company || '.test',
        initcap('${role}') || ' ' || upper(m.company) || '-' || lpad(m.n::text, 4, '0'), '${role}'
      from made m join bench_plan p using (company) join companies c on c.slug = p.slug
      returning id
    )
    insert into bench_people (user_id, company, role, n, subject, email)
    select m.id, m.company, '${role}', m.n, 'bench-' || m.company || '-${role}-' || m.n,
      '${role}-' || m.n || '@bench-' || m.company || '.test'
    from made m`;
  await run(people('admin', '1'), [benchIssuer]);
  await run(people('technician', `greatest(1, ceil(p.tanks / ${tanksPerTechnician}.0)::int)`), [benchIssuer]);
  await run(people('owner', `p.tanks * ${ownersPerTank}`), [benchIssuer]);
  // The same rules as plan.ts's helpers, checked once so the two never drift apart.
  const sample = await run(
    `select subject, email from bench_people where company = 'a' and role = 'owner' and n = 1`,
  );
  if (
    sample.rows[0]?.subject !== personSubject('a', 'owner', 1) ||
    sample.rows[0]?.email !== personEmail('a', 'owner', 1)
  ) {
    throw new Error('bench_people does not follow plan.ts');
  }

  say('tanks, owners and devices');
  await run(`
    with made as (
      select p.company, p.slug, n, gen_random_uuid() as id,
        (array['mixed-reef','sps-reef','soft-lps-reef','fish-only-marine','planted-freshwater',
               'community-freshwater','brackish'])[1 + (n - 1) % 7] as style,
        n <= p.device_history_tanks or n <= p.alert_tanks or p.company = 'd' as marine_only
      from bench_plan p cross join lateral generate_series(1, p.tanks) n
    ), tank as (
      insert into tanks (id, company_id, name, site_label, water_type, style, display_volume_l, sump_volume_l,
        set_up_on, assigned_technician_id, service_interval_days, last_visit_at, created_at, updated_at)
      select m.id, c.id, 'Tank ' || upper(m.company) || '-' || lpad(m.n::text, 4, '0'), 'Site ' || (1 + m.n % 97),
        (case when m.marine_only then 'marine'
              when m.style in ('planted-freshwater','community-freshwater') then 'fresh'
              when m.style = 'brackish' then 'brackish' else 'marine' end)::water_type,
        (case when m.marine_only then 'mixed-reef' else m.style end)::tank_style,
        200 + (m.n % 10) * 50, 60, (now() - interval '${historyDays + 35} days')::date,
        tech.user_id, 14, now() - ((m.n % 20) || ' days')::interval,
        now() - interval '${historyDays + 35} days', now()
      from made m join companies c on c.slug = m.slug
      join bench_people tech on tech.company = m.company and tech.role = 'technician'
        and tech.n = 1 + (m.n - 1) / ${tanksPerTechnician}
      returning id
    )
    insert into bench_tanks (tank_id, company, n) select m.id, m.company, m.n from made m`);
  await run(`insert into tank_members (tank_id, user_id)
    select t.tank_id, o.user_id from bench_tanks t
    join bench_people o on o.company = t.company and o.role = 'owner'
      and o.n between (t.n - 1) * ${ownersPerTank} + 1 and t.n * ${ownersPerTank}`);
  // Device tokens as plan.ts makes them; only their SHA-256 is stored, as the app does.
  await run(`update bench_tanks t set device_id = gen_random_uuid(),
      device_token = 'bwd_bench-' || t.company || '-' || lpad(t.n::text, 4, '0') || '-device-token'
    from bench_plan p
    where p.company = t.company and (t.n <= p.device_history_tanks or p.company = 'd')`);
  const token = await run(`select device_token from bench_tanks where company = 'd' and n = 1`);
  if (token.rows[0]?.device_token !== deviceToken('d', 1))
    throw new Error('device tokens do not follow plan.ts');
  await run(`insert into devices (id, company_id, tank_id, name, token_hash, token_hint, last_seen_at)
    select t.device_id, k.company_id, t.tank_id, 'Controller ' || upper(t.company) || '-' || t.n,
      encode(sha256(convert_to(t.device_token, 'UTF8')), 'hex'), left(t.device_token, 10), now()
    from bench_tanks t join tanks k on k.id = t.tank_id where t.device_id is not null`);

  // Foreign keys and the summary triggers are skipped while the year of readings goes in (the
  // rows are consistent by construction); the summaries are rebuilt set-based afterwards, which
  // is far quicker than the statement triggers over millions of rows.
  await run(`set session_replication_role = replica`);
  // Readings are partitioned by month: make every month the year of history touches, so none
  // lands in the default partition readings_older (which would then block that month's table).
  await run(
    `select ensure_reading_partitions(now() - interval '${historyDays + 1} days', now() + interval '3 months')`,
  );

  const history = await run(`select t.tank_id, t.device_id, k.company_id, t.n from bench_tanks t
    join bench_plan p using (company) join tanks k on k.id = t.tank_id
    where t.n <= p.device_history_tanks order by t.company, t.n`);
  const units: Record<(typeof deviceParameters)[number], string> = {
    temperature: '°C',
    ph: '',
    salinity: 'salinity',
  };
  let done = 0;
  for (const tank of history.rows) {
    // Every 5 minutes for a year: a daily swing with a little noise, inside a mixed reef's limits.
    await run(
      `insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source,
         device_id, created_at, updated_at)
       select $1, $2, p.parameter::parameter_key, v.value, v.value, p.unit, g, 'device', $3, g, g
       from generate_series(date_trunc('hour', now()) - interval '${historyDays} days', date_trunc('hour', now()),
              interval '5 minutes') g
       cross join (select unnest($4::text[]) as parameter, unnest($5::text[]) as unit) p
       cross join lateral (select round((case p.parameter
           when 'temperature' then 25.6 + 0.3 * sin(extract(epoch from g) / 13751) + (random() - 0.5) * 0.1
           when 'ph' then 8.15 + 0.08 * sin(extract(epoch from g) / 13751) + (random() - 0.5) * 0.02
           else 35 + (random() - 0.5) * 0.2 end)::numeric, 2)::float8 as value) v`,
      [
        tank.company_id,
        tank.tank_id,
        tank.device_id,
        [...deviceParameters],
        deviceParameters.map((p) => units[p]),
      ],
    );
    done += 1;
    if (done % 5 === 0 || done === history.rows.length)
      say(`device history: ${done}/${history.rows.length} tanks`);
  }

  say('weekly home tests');
  await run(`
    insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source,
      recorded_by, created_at, updated_at)
    select k.company_id, k.id, x.parameter::parameter_key, x.value, x.value, x.unit, g, 'home-test', o.user_id, g, g
    from bench_tanks t join bench_plan p using (company) join tanks k on k.id = t.tank_id
    join bench_people o on o.company = t.company and o.role = 'owner' and o.n = (t.n - 1) * ${ownersPerTank} + 1
    cross join lateral generate_series(now() - interval '${historyDays} days' + (t.n % 7) * interval '1 day',
      now() - interval '1 hour', interval '7 days') g
    cross join lateral (values
      ('nitrate', round((5 + random() * 6)::numeric, 1)::float8, 'mg/L NO3'),
      ('phosphate', round((0.03 + random() * 0.06)::numeric, 2)::float8, 'mg/L PO4'),
      (case when k.water_type = 'fresh' then 'kh' else 'alkalinity' end,
       round((case when k.water_type = 'fresh' then 4 else 8.2 end + random() * 0.6)::numeric, 1)::float8,
       case when k.water_type = 'fresh' then '°dKH' else 'dKH' end)
    ) x(parameter, value, unit)
    where p.home_tests and t.n > p.device_history_tanks`);
  await run(`set session_replication_role = origin`);

  // Derived reading data (latest readings, hourly and daily rollups) rebuilt set-based by the
  // schema's own function (drizzle/0016).
  say('rebuilding latest readings and rollups');
  await run(`select rebuild_all_reading_summaries()`);
  say('analyze');
  await run('analyze');
  const { rows: counts } = await run(`select count(*)::bigint as n from readings`);
  await run(`create table bench_seed (version int primary key, scale float8 not null,
    readings bigint not null, seeded_at timestamptz not null default now())`);
  await run(`insert into bench_seed (version, scale, readings) values ($1, $2, $3)`, [
    seedVersion,
    benchScale,
    counts[0].n,
  ]);
  say(`done: ${counts[0].n} readings`);
}

async function main() {
  const cluster = await startBenchCluster({ durable: false });
  try {
    const marker = await markerOf(cluster.baseUrl);
    if (marker?.version === seedVersion && marker.scale === benchScale) {
      say(`already seeded (version ${seedVersion}, scale ${benchScale}) in ${benchDataDir}; nothing to do`);
      return;
    }
    checkDisk();
    say(
      marker
        ? `seed version ${marker.version} at scale ${marker.scale} found: starting over`
        : `seeding version ${seedVersion} at scale ${benchScale} into ${benchDataDir}`,
    );
    await recreateDatabase(cluster.baseUrl);
    const database = connectDatabase(cluster.url, { max: 1 });
    await applyMigrations(database.db);
    await database.pool.end();
    const client = new pg.Client({ connectionString: cluster.url });
    await client.connect();
    try {
      await seed(client);
    } finally {
      await client.end();
    }
  } finally {
    await cluster.stop();
  }
}

await main();

import { eq, sql, type SQL } from 'drizzle-orm';
import type { AlertKind, AlertSeverity } from '@shared/alerts/kinds';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { formatValue } from '@shared/parameters/units';
import { tipCategoryLabels, type TipCategory } from '@shared/schemas/care-tips';
import { livestockStatusLabels } from '@shared/schemas/livestock';
import type { LivestockStatus } from '@shared/schemas/livestock-status';
import {
  encodeTimelineCursor,
  timelineKinds,
  type TimelineEntry,
  type TimelineKind,
  type TimelinePage,
  type TimelineQuery,
} from '@shared/schemas/timeline';
import { reportSummary } from '@shared/schemas/visit-summary';
import { visitKindLabels, visitReportContent, type VisitKind } from '@shared/schemas/visits';
import { markdownToPlainText } from '@shared/text/markdown';
import { formatDateTime } from '@shared/text/dates';
import { urgentCategoryNames, type UrgentCategory } from '@shared/urgent/categories';
import { urgentStatusNames, type UrgentStatus } from '@shared/urgent/lifecycle';
import type { Db } from '../db/client';
import { companies, type tanks } from '../db/schema/index';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import { companySpeciesId, resolveSpecies } from './species';

type TankRow = typeof tanks.$inferSelect;

/** One row of the union: what every source selects, its own facts in `data`. */
type TimelineRow = {
  kind: TimelineKind;
  id: string;
  /** ISO text to the millisecond: the sort key and the cursor are cut to what a JS date holds. */
  at_iso: string;
  data: Record<string, unknown>;
};

type EntryWords = Pick<TimelineEntry, 'title' | 'summary' | 'link' | 'editedAt' | 'body' | 'photoId'>;

interface Context {
  db: Db;
  tank: TankRow;
}

interface TimelineSource {
  /**
   * One tank's rows of this kind as `id`, `at` (timestamptz) and `data` (jsonb). Built only from
   * what the tank's owners may read: published reports, never a draft or a visit's planning note.
   */
  rows(tank: TankRow): SQL;
  /** The words of a page's rows of this kind, in the order given. */
  describe(rows: TimelineRow[], context: Context): Promise<EntryWords[]> | EntryWords[];
}

const tankLink = (tank: TankRow, query = '') => `/tanks/${tank.id}${query}`;

/** A short line from longer text: whitespace folded, cut at a word near `max` characters. */
function shortLine(text: string, max = 160): string {
  const folded = text.replace(/\s+/g, ' ').trim();
  if (folded.length <= max) return folded;
  const cut = folded.slice(0, max);
  const space = cut.lastIndexOf(' ');
  return `${(space > max / 2 ? cut.slice(0, space) : cut).replace(/[\s,.;:–-]+$/, '')}…`;
}

interface VisitData {
  visitKind: VisitKind;
  report: unknown;
  technician: string | null;
  editedAt: string | null;
}

interface LivestockData {
  status: LivestockStatus;
  note: string | null;
  first: boolean;
  catalogueSpeciesId: string | null;
  companySpeciesId: string | null;
  nickname: string | null;
  quantity: number;
}

interface AlertData {
  type: 'opened' | 'escalated' | 'resolved';
  severity: AlertSeverity;
  /** The reading the event was judged on, in stored units. */
  value: number | null;
  note: string | null;
  alertKind: AlertKind;
  parameter: ParameterKey | null;
  direction: string | null;
}

/**
 * What an alert is about, in words that stay true for each of its events. The alert row's own
 * title is rewritten at every change ("… back within limits" once resolved), and its events keep
 * no words of their own, so an event's entry is told from the alert's cause instead.
 */
function alertSubject({ alertKind, parameter, direction }: AlertData): string {
  const label = parameter ? parameterCatalogue[parameter].label : 'A reading';
  switch (alertKind) {
    case 'limit':
      return `${label} too ${direction === 'low' ? 'low' : 'high'}`;
    case 'rate':
      return `${label} ${direction === 'falling' ? 'falling' : 'rising'} fast`;
    case 'livestock':
      return `${label} too ${direction === 'low' ? 'low' : 'high'} for some of the livestock`;
    case 'free-ammonia':
      return 'Harmful free ammonia';
    case 'device-stale':
      return 'A device stopped reporting';
    case 'test-overdue':
      return `${label} test overdue`;
  }
}

interface TipData {
  title: string;
  category: TipCategory;
  body: string;
  photoId: string | null;
}

const severityWords: Readonly<Record<AlertSeverity, string>> = {
  notice: 'Notice',
  warning: 'Warning',
  critical: 'Critical',
};

interface UrgentData {
  type: UrgentStatus;
  requestId: string;
  category: UrgentCategory;
  description: string;
  actor: string | null;
  note: string;
  eta: string | null;
}

const isoText = (column: string) => `to_char(${column} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/**
 * Every kind of entry and where it comes from. Adding a kind to `timelineKinds` makes this record
 * incomplete until its source is written here; nothing else in the service changes.
 */
const sources: Record<TimelineKind, TimelineSource> = {
  visit: {
    rows: (tank) => sql`
      select v.id, v.published_at as at, jsonb_build_object(
        'visitKind', v.kind, 'report', v.published, 'technician', u.name,
        'editedAt', ${sql.raw(isoText('v.edited_at'))}) as data
      from visits v
      -- The visit's technician; whoever published it when none is named (as the news of it says).
      left join users u on u.id = coalesce(v.technician_id, v.published_by)
      where v.tank_id = ${tank.id} and v.published_at is not null and v.published is not null`,
    describe: (rows, { tank }) =>
      rows.map((row) => {
        const data = row.data as unknown as VisitData;
        const summary = reportSummary(visitReportContent.parse(data.report));
        return {
          title: `Visit report: ${visitKindLabels[data.visitKind].toLowerCase()}`,
          summary: [data.technician ? `By ${data.technician}.` : '', summary].filter(Boolean).join(' '),
          link: tankLink(tank, `?section=visits&visit=${row.id}`),
          editedAt: data.editedAt,
          body: null,
          photoId: null,
        };
      }),
  },
  livestock: {
    rows: (tank) => sql`
      select e.id, e.changed_at as at, jsonb_build_object(
        'status', e.status, 'note', e.note,
        'first', row_number() over (partition by e.livestock_id order by e.changed_at, e.created_at, e.id) = 1,
        'catalogueSpeciesId', l.catalogue_species_id, 'companySpeciesId', l.company_species_id,
        'nickname', l.nickname, 'quantity', l.quantity) as data
      from livestock_status_events e
      join livestock l on l.id = e.livestock_id
      where l.tank_id = ${tank.id}`,
    async describe(rows, { db, tank }) {
      const all = rows.map((row) => row.data as unknown as LivestockData);
      const speciesIdOf = (data: LivestockData) =>
        data.catalogueSpeciesId ?? companySpeciesId(data.companySpeciesId!);
      const species = await resolveSpecies(db, tank.companyId, all.map(speciesIdOf));
      return all.map((data) => {
        const common = species.get(speciesIdOf(data))?.commonName ?? 'An animal';
        const name = [
          data.quantity > 1 ? `${common} ×${data.quantity}` : common,
          data.nickname ? `(${data.nickname})` : '',
        ]
          .filter(Boolean)
          .join(' ');
        const condition = livestockStatusLabels[data.status];
        const title = data.first
          ? `Added: ${name}`
          : data.status === 'removed' || data.status === 'died'
            ? `${condition}: ${name}`
            : `${name.charAt(0).toUpperCase()}${name.slice(1)} — ${condition.toLowerCase()}`;
        return {
          title,
          summary: data.note ? shortLine(data.note) : `Condition: ${condition.toLowerCase()}.`,
          link: tankLink(tank, '?section=livestock'),
          editedAt: null,
          body: null,
          photoId: null,
        };
      });
    },
  },
  alert: {
    rows: (tank) => sql`
      select ev.id, ev.at, jsonb_build_object(
        'type', ev.type, 'severity', ev.severity, 'value', ev.value, 'note', ev.note,
        'alertKind', a.kind, 'parameter', a.parameter, 'direction', a.direction) as data
      from alert_events ev
      join alerts a on a.id = ev.alert_id
      where a.tank_id = ${tank.id} and ev.type in ('opened', 'escalated', 'resolved')`,
    describe: (rows, { tank }) =>
      rows.map((row) => {
        const data = row.data as unknown as AlertData;
        const subject = alertSubject(data);
        const severity = severityWords[data.severity];
        const reading =
          data.parameter && data.value !== null
            ? `, reading ${formatValue(data.parameter, data.value, { trim: true })}`
            : '';
        const words = {
          opened: { title: `Alert opened: ${subject}`, summary: `${severity}${reading}.` },
          escalated: {
            title: `Alert now ${severity.toLowerCase()}: ${subject}`,
            summary: data.note ?? `Now ${severity.toLowerCase()}${reading}.`,
          },
          resolved: {
            title: `Alert resolved: ${subject}`,
            // Staff say what they did; the engine closes an alert once its cause has cleared.
            summary: data.note ?? 'The cause cleared and the alert closed by itself.',
          },
        }[data.type];
        return {
          title: words.title,
          summary: shortLine(words.summary),
          // Where alert notifications lead: the tank's summary, which lists its open and recent alerts.
          link: tankLink(tank),
          editedAt: null,
          body: null,
          photoId: null,
        };
      }),
  },
  tip: {
    rows: (tank) => sql`
      select t.id, r.delivered_at as at, jsonb_build_object(
        'title', t.title, 'category', t.category, 'body', t.body, 'photoId', t.photo_id) as data
      from care_tip_tanks r
      join care_tips t on t.id = r.tip_id
      where r.tank_id = ${tank.id} and t.company_id = ${tank.companyId}
        and t.withdrawn_at is null and t.status <> 'withdrawn'`,
    describe: (rows, { tank }) =>
      rows.map((row) => {
        const data = row.data as unknown as TipData;
        return {
          title: data.title,
          summary: shortLine(`${tipCategoryLabels[data.category]}: ${markdownToPlainText(data.body)}`),
          link: tankLink(tank, `?section=timeline&tip=${row.id}`),
          editedAt: null,
          body: data.body,
          photoId: data.photoId,
        };
      }),
  },
  urgent: {
    // Owners follow the status; escalations are the company's own business and never shown here.
    rows: (tank) => sql`
      select e.id, e.at, jsonb_build_object(
        'type', e.type, 'requestId', r.id, 'category', r.category, 'description', r.description,
        'actor', e.actor_name, 'note', e.note, 'eta', ${sql.raw(isoText('e.eta'))}) as data
      from urgent_request_events e
      join urgent_requests r on r.id = e.request_id
      where r.tank_id = ${tank.id} and e.type <> 'escalated'`,
    async describe(rows, { db, tank }) {
      const zone = await tankZone(db, tank);
      return rows.map((row) => {
        const data = row.data as unknown as UrgentData;
        const expected = data.eta ? `Expected by ${formatDateTime(data.eta, zone)}.` : '';
        const summaries: Record<UrgentStatus, string> = {
          requested: `Asked by ${data.actor ?? 'the owner'}: ${data.description}`,
          acknowledged: [expected, data.note].filter(Boolean).join(' '),
          assigned: [expected || 'A technician is on it.', data.note].filter(Boolean).join(' '),
          'on-the-way': [expected, data.note].filter(Boolean).join(' '),
          'on-site': data.note || 'The technician is at the tank.',
          resolved: data.note || 'The request is closed.',
          // The reason given for declining is the event's note.
          declined: data.note,
        };
        return {
          title:
            data.type === 'requested'
              ? `Urgent visit requested: ${urgentCategoryNames[data.category].label}`
              : `Urgent visit: ${urgentStatusNames[data.type]}`,
          summary: shortLine(summaries[data.type]),
          link: `/urgent/${data.requestId}`,
          editedAt: null,
          body: null,
          photoId: null,
        };
      });
    },
  },
};

/**
 * The sort order of the feed, newest first; equal times fall back to the kind, then the id, so the
 * order is total and a cursor names exactly one place in it.
 */
const order = sql`entries.at desc, entries.kind collate "C" asc, entries.id desc`;

async function tankZone(db: Db, tank: TankRow): Promise<string> {
  if (tank.timeZone) return tank.timeZone;
  const [company] = await db
    .select({ timeZone: companies.timeZone })
    .from(companies)
    .where(eq(companies.id, tank.companyId));
  return company!.timeZone;
}

/**
 * One tank's story, newest first, for anyone who may read the tank (another company's or another
 * owner's tank is a 404): published visit reports, livestock changes, alerts opened, escalated and
 * resolved, the care tips it received that were not withdrawn, and each change of its urgent visit
 * requests.
 */
export async function tankTimeline(
  db: Db,
  actor: Actor,
  tankId: string,
  query: TimelineQuery,
): Promise<TimelinePage> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const kinds = query.kinds && query.kinds.length > 0 ? query.kinds : timelineKinds;
  const union = sql.join(
    kinds.map(
      (kind) => sql`select ${kind}::text as kind, s.id, date_trunc('milliseconds', s.at) as at, s.data
        from (${sources[kind].rows(tank)}) s`,
    ),
    sql` union all `,
  );
  const before = query.before;
  // Keyset on (at desc, kind asc, id desc): rows written after the first page (newer, so above
  // the cursor) never shift the pages that follow, and nothing is skipped or shown twice.
  const after = before
    ? sql`where entries.at < ${before.at}::timestamptz
        or (entries.at = ${before.at}::timestamptz and entries.kind collate "C" > ${before.kind})
        or (entries.at = ${before.at}::timestamptz and entries.kind = ${before.kind} and entries.id < ${before.id}::uuid)`
    : sql``;
  const result = await db.execute<TimelineRow>(sql`
    select kind, id, ${sql.raw(isoText('entries.at'))} as at_iso, data
    from (${union}) entries
    ${after}
    order by ${order}
    limit ${query.limit + 1}`);
  const rows = result.rows.slice(0, query.limit);

  const timeZone = await tankZone(db, tank);
  const words = new Map<TimelineRow, EntryWords>();
  for (const kind of kinds) {
    const ofKind = rows.filter((row) => row.kind === kind);
    if (ofKind.length === 0) continue;
    const described = await sources[kind].describe(ofKind, { db, tank });
    ofKind.forEach((row, index) => words.set(row, described[index]!));
  }
  const entries = rows.map((row) => ({
    kind: row.kind,
    id: row.id,
    at: row.at_iso,
    timeZone,
    ...words.get(row)!,
  }));
  const last = entries.at(-1);
  return {
    entries,
    next: result.rows.length > query.limit && last ? encodeTimelineCursor(last) : null,
  };
}

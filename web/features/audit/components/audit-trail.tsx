import { useWatch } from 'react-hook-form';
import { z } from 'zod';
import {
  auditAction,
  auditActionLabels,
  auditActions,
  auditTargetKind,
  auditTargetKindLabels,
  auditTargetKinds,
} from '@shared/audit/actions';
import type { AuditEntry, AuditFilters } from '@shared/schemas/audit';
import { Button } from '../../../components/button';
import { Form, useZodForm } from '../../../components/form';
import { SelectField, TextField } from '../../../components/form-fields';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { formatDateTime } from '../../../lib/format';
import { exportAuditUrl } from '../api/export-audit';
import { useListAudit } from '../api/list-audit';
import { AuditChanges, AuditDetails } from './audit-changes';

/** Day boundaries of the date filters, in the person's own time zone. */
const dayStart = (day: string) => (day ? new Date(`${day}T00:00:00`).toISOString() : undefined);
const dayEnd = (day: string) => (day ? new Date(`${day}T23:59:59.999`).toISOString() : undefined);

/** The filters as chosen; "" is "all" (or no bound), and each choice applies as it is made. */
const auditFilterForm = z.object({
  action: z.union([z.literal(''), auditAction]),
  targetKind: z.union([z.literal(''), auditTargetKind]),
  actor: z.string().max(200, 'Use at most 200 characters.'),
  fromDay: z.string(),
  toDay: z.string(),
});
type AuditFilterValues = z.infer<typeof auditFilterForm>;

function Who({ entry }: { entry: AuditEntry }) {
  if (!entry.actor) return <span className="text-ink-700">Brinewatch itself</span>;
  return (
    <>
      <span className="font-bold text-ink-900">{entry.actor.name}</span>
      {entry.actor.email && <span className="block break-all text-xs text-ink-700">{entry.actor.email}</span>}
    </>
  );
}

function What({ entry }: { entry: AuditEntry }) {
  return (
    <>
      <span className="font-bold text-ink-900">{auditActionLabels[entry.action]}</span>
      <AuditDetails entry={entry} />
      <AuditChanges entry={entry} />
    </>
  );
}

function Target({ entry }: { entry: AuditEntry }) {
  if (!entry.target) return <span className="text-ink-700">—</span>;
  return (
    <>
      <span className="block text-xs font-bold uppercase tracking-wide text-ink-700">
        {auditTargetKindLabels[entry.target.kind]}
      </span>
      <span className="text-ink-900">{entry.target.label}</span>
    </>
  );
}

/** A browser's full description is long; the start says enough here, the CSV keeps all of it. */
const shortAgent = (agent: string) => (agent.length > 60 ? `${agent.slice(0, 57)}…` : agent);

function FromWhere({ entry }: { entry: AuditEntry }) {
  if (!entry.ip && !entry.userAgent) return <span className="text-ink-700">Not from a browser</span>;
  return (
    <>
      <span className="font-mono text-ink-900">{entry.ip ?? 'Address unknown'}</span>
      {entry.userAgent && (
        <span className="block break-all text-xs text-ink-700">{shortAgent(entry.userAgent)}</span>
      )}
    </>
  );
}

const When = ({ entry }: { entry: AuditEntry }) => (
  <time dateTime={entry.at} className="whitespace-nowrap">
    {formatDateTime(entry.at)}
  </time>
);

function AuditTable({ entries }: { entries: AuditEntry[] }) {
  return (
    <div className="hidden overflow-x-auto rounded-lg border border-ink-100 bg-white md:block">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Audit trail, newest first</caption>
        <thead className="bg-ink-50 text-ink-900">
          <tr>
            {['When', 'Who', 'What', 'About', 'From where'].map((heading) => (
              <th key={heading} scope="col" className="px-3 py-2">
                {heading}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {entries.map((entry) => (
            <tr key={entry.id} className="border-t border-ink-100 align-top">
              <td className="px-3 py-2">
                <When entry={entry} />
              </td>
              <td className="px-3 py-2">
                <Who entry={entry} />
              </td>
              <td className="px-3 py-2">
                <What entry={entry} />
              </td>
              <td className="px-3 py-2">
                <Target entry={entry} />
              </td>
              <td className="max-w-56 px-3 py-2">
                <FromWhere entry={entry} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function AuditCards({ entries }: { entries: AuditEntry[] }) {
  return (
    <ul className="space-y-3 md:hidden" aria-label="Audit trail, newest first">
      {entries.map((entry) => (
        <li key={entry.id} className="rounded-card bg-white p-4 shadow-card">
          <p className="text-sm text-ink-700">
            <When entry={entry} />
          </p>
          <div className="mt-1">
            <What entry={entry} />
          </div>
          <dl className="mt-3 grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-2 text-sm">
            <dt className="font-bold text-ink-700">Who</dt>
            <dd>
              <Who entry={entry} />
            </dd>
            <dt className="font-bold text-ink-700">About</dt>
            <dd>
              <Target entry={entry} />
            </dd>
            <dt className="font-bold text-ink-700">From</dt>
            <dd>
              <FromWhere entry={entry} />
            </dd>
          </dl>
        </li>
      ))}
    </ul>
  );
}

/** The company's audit trail: filters, the entries newest first, and the filtered list as CSV. */
export function AuditTrail() {
  const form = useZodForm(auditFilterForm, {
    defaultValues: { action: '', targetKind: '', actor: '', fromDay: '', toDay: '' },
  });
  const [action, targetKind, actor, fromDay, toDay] = useWatch({
    control: form.control,
    name: ['action', 'targetKind', 'actor', 'fromDay', 'toDay'],
  });
  const filters: AuditFilters = {
    action: action || undefined,
    targetKind: targetKind || undefined,
    actor: actor.trim().slice(0, 200) || undefined,
    from: dayStart(fromDay),
    to: dayEnd(toDay),
  };
  const list = useListAudit(filters);
  const entries = list.data?.pages.flatMap((page) => page.entries) ?? [];
  const filtered = Object.values(filters).some(Boolean);

  return (
    <div className="space-y-4">
      <Form
        form={form}
        // Each filter applies as it is chosen; there is nothing to send.
        onSubmit={() => undefined}
        className="grid gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-2 lg:grid-cols-5"
        aria-label="Filter the audit trail"
      >
        <SelectField<AuditFilterValues>
          name="action"
          label="What happened"
          options={[
            { value: '', label: 'Everything' },
            ...auditActions.map((key) => ({ value: key, label: auditActionLabels[key] })),
          ]}
        />
        <TextField<AuditFilterValues> name="actor" label="Who" hint="Part of a name or e-mail" />
        <SelectField<AuditFilterValues>
          name="targetKind"
          label="About"
          options={[
            { value: '', label: 'Anything' },
            ...auditTargetKinds.map((key) => ({ value: key, label: auditTargetKindLabels[key] })),
          ]}
        />
        <TextField<AuditFilterValues> name="fromDay" label="From" type="date" />
        <TextField<AuditFilterValues> name="toDay" label="To" type="date" />
      </Form>

      <div className="flex flex-wrap gap-2">
        <a
          href={exportAuditUrl(filters)}
          download
          className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
        >
          Download CSV
        </a>
      </div>

      {list.isPending ? (
        <LoadingState label="Loading the audit trail…" />
      ) : list.isError ? (
        <ErrorState error={list.error} what="the audit trail" onRetry={() => void list.refetch()} />
      ) : entries.length === 0 ? (
        <EmptyState title={filtered ? 'Nothing matches these filters' : 'Nothing recorded yet'}>
          {filtered
            ? 'Change or clear the filters to see more.'
            : 'Sign-ins, changes to people and settings, and downloads will be listed here.'}
        </EmptyState>
      ) : (
        <>
          <AuditTable entries={entries} />
          <AuditCards entries={entries} />
        </>
      )}
      {list.hasNextPage && (
        <Button tone="secondary" onClick={() => void list.fetchNextPage()} disabled={list.isFetchingNextPage}>
          {list.isFetchingNextPage ? 'Loading…' : 'Show older entries'}
        </Button>
      )}
    </div>
  );
}

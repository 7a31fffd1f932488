import { useEffect, useMemo, useState } from 'react';
import { Link } from 'react-router';
import type { WaterType } from '@shared/parameters/water-types';
import { emptyReport, visitKindLabels, visitReportContent, type VisitDetail } from '@shared/schemas/visits';
import { reportSummary } from '@shared/schemas/visit-summary';
import { Button } from '../../../components/button';
import { Form, FormProblem, useZodForm } from '../../../components/form';
import { ErrorState, LoadingState } from '../../../components/states';
import { TipSuggestions } from '../../../components/tip-suggestions';
import { can, useMe } from '../../../lib/auth';
import { applyServerIssues } from '../../../lib/form-issues';
import { formatDateTime } from '../../../lib/format';
import { useEquipment } from '../../../lib/queries/equipment';
import { useVisit } from '../api/get-visit';
import { usePublishReport } from '../api/publish-report';
import {
  formValuesOf,
  keptFormValues,
  reportFieldFor,
  reportFormSchema,
  type ReportFormValues,
} from '../utils/report-form';
import { DraftInvoiceButton } from '../../../components/draft-invoice-button';
import { PhotosSection } from './report-photos';
import {
  CarriedItemsSection,
  ChecklistSection,
  ItemsUsedSection,
  LivestockSection,
  NextSection,
  NotesSection,
  ReadingsSection,
  TimesSection,
} from './report-sections';
import { readLocalDraft, useReportSync, type LocalDraft, type SyncState } from './use-report-sync';

/** The visit report a technician writes at the tank: phone first, saved as it is typed. */
export function VisitReportEditor({ visitId }: { visitId: string }) {
  const visit = useVisit(visitId);
  const tankId = visit.data?.tankId ?? '';
  // Asked for once the visit names its tank (never `/tanks//equipment`).
  const equipment = useEquipment(tankId, tankId !== '');
  // What this phone kept of the report (undefined while reading it).
  const [local, setLocal] = useState<LocalDraft | null | undefined>(undefined);
  useEffect(() => {
    let live = true;
    readLocalDraft(visitId)
      .then((kept) => live && setLocal(kept ?? null))
      .catch(() => live && setLocal(null));
    return () => {
      live = false;
    };
  }, [visitId]);

  if (visit.isError)
    return <ErrorState error={visit.error} what="this visit" onRetry={() => void visit.refetch()} />;
  if (visit.isPending || local === undefined || (equipment.isPending && !equipment.isError)) {
    return <LoadingState label="Opening the visit report…" />;
  }
  if (visit.data.status === 'cancelled') {
    return (
      <p className="rounded-card bg-white p-4 shadow-card">
        This visit was cancelled. Restore it on the schedule before writing its report.
      </p>
    );
  }
  return (
    <ReportForm
      visit={visit.data}
      local={local}
      waterType={visit.data.waterType}
      equipmentIds={(equipment.data ?? []).map((item) => item.id)}
    />
  );
}

function ReportForm({
  visit,
  local,
  waterType,
  equipmentIds,
}: {
  visit: VisitDetail;
  local: LocalDraft | null;
  waterType: WaterType;
  equipmentIds: string[];
}) {
  const zone = visit.timeZone;
  const schema = useMemo(() => reportFormSchema(zone), [zone]);
  const serverValues = formValuesOf(visit.draft ?? emptyReport, zone, equipmentIds);
  // A phone copy on top of the server's version carries on; one from an older version is a conflict.
  const start: { values: ReportFormValues; state: SyncState } = !local
    ? { values: serverValues, state: { kind: 'saved', at: null } }
    : local.baseVersion === visit.version
      ? { values: keptFormValues(local.values), state: { kind: 'waiting' } }
      : { values: keptFormValues(local.values), state: { kind: 'conflict', theirs: visit } };
  const [initial] = useState(start);
  const form = useZodForm(schema, { defaultValues: initial.values });
  const sync = useReportSync({ visit, form, schema, startVersion: visit.version, startState: initial.state });
  const publish = usePublishReport(visit.id);
  const [published, setPublished] = useState<string | null>(null);
  const wasPublished = visit.published !== null;
  const { data: me } = useMe();

  return (
    <Form
      form={form}
      aria-label="Visit report"
      className="grid grid-cols-[minmax(0,1fr)] gap-4"
      fieldFor={reportFieldFor}
      onSubmit={async () => {
        setPublished(null);
        if (!(await sync.flush())) {
          form.setError('root.server', {
            type: 'server',
            message:
              sync.state.kind === 'offline' || !navigator.onLine
                ? 'You are offline. The report is kept on this phone; publish when you are back online.'
                : 'The report could not be saved yet; see the marked fields.',
          });
          return;
        }
        try {
          const done = await publish.mutateAsync(sync.version.current);
          setPublished(done.publishedAt === null ? null : (done.editedAt ?? done.publishedAt));
        } catch (error) {
          applyServerIssues(form, error, reportFieldFor);
        }
      }}
    >
      <ReportHeader visit={visit} state={sync.state} />
      {sync.state.kind === 'conflict' && (
        <ConflictChooser
          mine={form.getValues()}
          theirs={sync.state.theirs}
          schema={schema}
          onChoose={(choice, theirs) =>
            void sync.resolveConflict(
              choice,
              theirs,
              formValuesOf(theirs.draft ?? emptyReport, zone, equipmentIds),
            )
          }
        />
      )}
      <TimesSection zone={zone} />
      <CarriedItemsSection items={visit.carriedItems} />
      <ChecklistSection tankId={visit.tankId} systemVolumeL={visit.systemVolumeL} waterType={waterType} />
      {!wasPublished ? (
        <>
          <ReadingsSection
            waterType={waterType}
            arrivedAt={() => schema.safeParse(form.getValues()).data?.arrivedAt ?? null}
          />
          <LivestockSection tankId={visit.tankId} waterType={waterType} />
        </>
      ) : (
        <p className="rounded-card bg-white p-4 text-ink-700 shadow-card">
          Readings and livestock changes were applied when this report was published; correct them on the
          tank’s readings or livestock screens.
        </p>
      )}
      <ItemsUsedSection />
      <PhotosSection tankId={visit.tankId} visitId={visit.id} />
      <NotesSection />
      <NextSection />
      <div className="sticky bottom-0 grid gap-2 rounded-card bg-white p-4 shadow-card">
        <FormProblem />
        {published && (
          <p role="status" className="font-bold text-healthy-700">
            Published {formatDateTime(published, zone)}. The owners have been told.{' '}
            <Link to={`/tanks/${visit.tankId}?section=visits&visit=${visit.id}`} className="underline">
              See it as they do
            </Link>
          </p>
        )}
        <Button
          type="submit"
          disabled={publish.isPending || sync.state.kind === 'conflict'}
          className="w-full sm:w-auto"
        >
          {publish.isPending ? 'Publishing…' : wasPublished ? 'Publish the changes' : 'Publish report'}
        </Button>
      </div>
      {wasPublished && can(me, 'invoices:manage') && (
        <div className="rounded-card bg-white p-4 shadow-card">
          <p className="mb-2 text-sm text-ink-700">
            The invoice is drafted from the published report: its service, time on site, consumables and
            parts.
          </p>
          <DraftInvoiceButton source={{ visitId: visit.id }} />
        </div>
      )}
      {published && <TipSuggestions tankId={visit.tankId} />}
    </Form>
  );
}

const stateWords = (state: SyncState): { text: string; tone: 'good' | 'busy' | 'warn' | 'bad' } => {
  switch (state.kind) {
    case 'saved':
      return { text: state.at === null ? 'Saved' : 'Saved', tone: 'good' };
    case 'waiting':
      return { text: 'Saving soon…', tone: 'busy' };
    case 'saving':
      return { text: 'Saving…', tone: 'busy' };
    case 'offline':
      return { text: 'Offline — kept on this phone', tone: 'warn' };
    case 'invalid':
      return { text: 'Check the marked fields — kept on this phone', tone: 'warn' };
    case 'failed':
      return { text: `Not saved yet (${state.message}) — kept on this phone`, tone: 'bad' };
    case 'conflict':
      return { text: 'Changed on another device — choose a version', tone: 'bad' };
  }
};

const toneClasses = {
  good: 'bg-healthy-100 text-healthy-700',
  busy: 'bg-ink-100 text-ink-900',
  warn: 'bg-watch-100 text-watch-700',
  bad: 'bg-alert-100 text-alert-700',
} as const;

function ReportHeader({ visit, state }: { visit: VisitDetail; state: SyncState }) {
  const words = stateWords(state);
  return (
    <header className="sticky top-0 z-10 -mx-4 grid gap-1 bg-sand-50/95 px-4 py-3 backdrop-blur sm:static sm:mx-0 sm:px-0">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h1 className="text-xl font-bold text-ink-900 sm:text-2xl">{visit.tankName}</h1>
        <p
          role="status"
          aria-live="polite"
          className={`rounded-full px-3 py-1 text-sm font-bold ${toneClasses[words.tone]}`}
        >
          {words.text}
        </p>
      </div>
      <p className="text-sm text-ink-700">
        {visitKindLabels[visit.kind]} · {formatDateTime(visit.windowStart, visit.timeZone)}
        {visit.siteLabel ? ` · ${visit.siteLabel}` : ''}
        {visit.technician ? ` · ${visit.technician.name}` : ''}
      </p>
    </header>
  );
}

function ConflictChooser({
  mine,
  theirs,
  schema,
  onChoose,
}: {
  mine: ReportFormValues;
  theirs: VisitDetail;
  schema: ReturnType<typeof reportFormSchema>;
  onChoose: (choice: 'mine' | 'theirs', theirs: VisitDetail) => void;
}) {
  const parsedMine = schema.safeParse(mine);
  const theirsContent = visitReportContent.parse(theirs.draft ?? {});
  const describe = (notes: string, summary: string) => (
    <>
      <p className="text-ink-900">{summary || 'No tasks recorded yet.'}</p>
      {notes && <p className="mt-1 line-clamp-4 whitespace-pre-line text-sm text-ink-700">{notes}</p>}
    </>
  );
  return (
    <section
      role="alert"
      className="grid gap-3 rounded-card border-2 border-alert-700 bg-white p-4 shadow-card"
    >
      <h2 className="text-lg font-bold text-alert-700">This report was also changed on another device</h2>
      <p className="text-ink-900">
        Nothing was overwritten. Choose which version to keep; the other is discarded.
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        <div className="rounded-lg border border-ink-100 p-3">
          <h3 className="font-bold text-ink-900">On this phone</h3>
          {describe(
            mine.notes,
            parsedMine.success ? reportSummary(parsedMine.data) : 'Some fields need attention.',
          )}
          <Button className="mt-3 w-full" onClick={() => onChoose('mine', theirs)}>
            Keep this phone’s version
          </Button>
        </div>
        <div className="rounded-lg border border-ink-100 p-3">
          <h3 className="font-bold text-ink-900">Saved from the other device</h3>
          {describe(theirsContent.notes, reportSummary(theirsContent))}
          <Button tone="secondary" className="mt-3 w-full" onClick={() => onChoose('theirs', theirs)}>
            Use the saved version
          </Button>
        </div>
      </div>
    </section>
  );
}

import { useId, useState } from 'react';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { formatValue } from '@shared/parameters/units';
import { limitsFromComfort } from '@shared/readings/comfort-limits';
import { parameterLimits, type ParameterLimits, type ParameterLimitsView } from '@shared/schemas/limits';
import { Button } from '../../../components/button';
import { ErrorState, LoadingState } from '../../../components/states';
import { ApiError } from '../../../lib/api-client';
import { parseDecimal } from '../../calculators/utils/parse-decimal';
import { useLimits } from '../api/get-limits';
import { useUpdateLimits } from '../api/update-limits';

const bounds = ['critLow', 'warnLow', 'warnHigh', 'critHigh'] as const;
type Bound = (typeof bounds)[number];
const boundLabels: Record<Bound, string> = {
  critLow: 'Critical below',
  warnLow: 'Warning below',
  warnHigh: 'Warning above',
  critHigh: 'Critical above',
};

/** What is being edited for one parameter: four typed bounds, or "back to the template". */
type Draft = { kind: 'bounds'; text: Record<Bound, string> } | { kind: 'template' };

const textOf = (limits: ParameterLimits | null): Record<Bound, string> => ({
  critLow: limits?.critLow == null ? '' : String(limits.critLow),
  warnLow: limits?.warnLow == null ? '' : String(limits.warnLow),
  warnHigh: limits?.warnHigh == null ? '' : String(limits.warnHigh),
  critHigh: limits?.critHigh == null ? '' : String(limits.critHigh),
});

function limitsFromText(
  text: Record<Bound, string>,
): { limits: ParameterLimits } | { errors: Partial<Record<Bound, string>> } {
  const errors: Partial<Record<Bound, string>> = {};
  const limits = { warnLow: null, warnHigh: null, critLow: null, critHigh: null } as ParameterLimits;
  for (const bound of bounds) {
    const parsed = parseDecimal(text[bound]);
    if (parsed.state === 'invalid') errors[bound] = parsed.reason;
    else limits[bound] = parsed.state === 'number' ? parsed.value : null;
  }
  if (Object.keys(errors).length > 0) return { errors };
  const checked = parameterLimits.safeParse(limits);
  if (!checked.success) {
    for (const issue of checked.error.issues) errors[issue.path[0] as Bound] = issue.message;
    return { errors };
  }
  return { limits };
}

function range(parameter: ParameterKey, low: number | null, high: number | null): string {
  const f = (value: number) => formatValue(parameter, value, { trim: true });
  if (low !== null && high !== null) return `${f(low)} – ${f(high)}`;
  if (low !== null) return `from ${f(low)}`;
  if (high !== null) return `up to ${f(high)}`;
  return 'none';
}

/** Staff set each parameter's warning and critical bands, with the template and the livestock's comfort range beside them. */
export function LimitsEditor({ tankId }: { tankId: string }) {
  const limits = useLimits(tankId);
  const update = useUpdateLimits(tankId);
  const [drafts, setDrafts] = useState<Partial<Record<ParameterKey, Draft>>>({});
  const [serverIssues, setServerIssues] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);

  if (limits.isPending) return <LoadingState label="Loading limits…" />;
  if (limits.isError)
    return <ErrorState error={limits.error} what="the limits" onRetry={() => void limits.refetch()} />;
  const view = limits.data;

  const changed = Object.entries(drafts) as [ParameterKey, Draft][];
  const results = new Map(
    changed.map(([parameter, draft]) => [
      parameter,
      draft.kind === 'bounds' ? limitsFromText(draft.text) : null,
    ]),
  );
  const invalid = [...results.values()].some((result) => result !== null && 'errors' in result);

  const setDraft = (parameter: ParameterKey, draft: Draft | undefined) => {
    setSaved(false);
    setServerIssues({});
    setDrafts((current) => {
      const next = { ...current };
      if (draft) next[parameter] = draft;
      else delete next[parameter];
      return next;
    });
  };

  const save = () => {
    if (invalid || changed.length === 0) return;
    const body: Partial<Record<ParameterKey, ParameterLimits | null>> = {};
    for (const [parameter, draft] of changed) {
      const result = results.get(parameter);
      body[parameter] =
        draft.kind === 'template' ? null : result && 'limits' in result ? result.limits : null;
    }
    update.mutate(
      { limits: body },
      {
        onSuccess: () => {
          setDrafts({});
          setSaved(true);
        },
        onError: (error) => {
          if (!(error instanceof ApiError)) return;
          setServerIssues(
            Object.fromEntries(
              error.issues.map((issue) => [issue.path.replace(/^body\.limits\./, ''), issue.message]),
            ),
          );
        },
      },
    );
  };

  return (
    <section aria-labelledby="limits-title" className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <h3 id="limits-title" className="text-xl font-bold text-ink-900">
        Limits
      </h3>
      <p className="mt-1 text-sm text-ink-700">
        A reading strictly beyond a bound opens a warning or critical alert; leave a bound empty for no limit
        on that side. Values are in each parameter&apos;s stored unit. Templates: {view.templateSource}
      </p>
      {view.inhabitants > 0 ? (
        <p className="mt-1 text-sm text-ink-700">
          Comfort ranges come from the care profiles of the {view.inhabitants} kinds of livestock in the tank
          now. {view.comfortSource}
        </p>
      ) : (
        <p className="mt-1 text-sm text-ink-700">
          No livestock recorded yet, so there is no comfort range to compare.
        </p>
      )}

      <ul className="mt-4 space-y-3">
        {view.parameters.map((p) => (
          <LimitRow
            key={p.parameter}
            view={p}
            draft={drafts[p.parameter]}
            result={results.get(p.parameter)}
            serverIssues={serverIssues}
            onDraft={(draft) => setDraft(p.parameter, draft)}
          />
        ))}
      </ul>

      <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-ink-100 pt-4">
        <Button onClick={save} disabled={changed.length === 0 || invalid || update.isPending}>
          {update.isPending
            ? 'Saving…'
            : changed.length > 0
              ? `Save ${changed.length} change${changed.length === 1 ? '' : 's'}`
              : 'No changes'}
        </Button>
        {changed.length > 0 && (
          <Button tone="secondary" onClick={() => setDrafts({})}>
            Undo changes
          </Button>
        )}
        {invalid && <p className="font-bold text-alert-700">Fix the marked limits first.</p>}
        {saved && (
          <p role="status" className="font-bold text-healthy-700">
            ✓ Limits saved.
          </p>
        )}
        {update.isError && !(update.error instanceof ApiError && update.error.issues.length > 0) && (
          <p role="alert" className="font-bold text-alert-700">
            The limits could not be saved: {update.error.message}
          </p>
        )}
      </div>
    </section>
  );
}

interface LimitRowProps {
  view: ParameterLimitsView;
  draft: Draft | undefined;
  result: ReturnType<typeof limitsFromText> | null | undefined;
  serverIssues: Record<string, string>;
  onDraft: (draft: Draft | undefined) => void;
}

function LimitRow({ view, draft, result, serverIssues, onDraft }: LimitRowProps) {
  const id = useId();
  const { parameter } = view;
  const info = parameterCatalogue[parameter];
  const text =
    draft?.kind === 'bounds' ? draft.text : textOf(draft?.kind === 'template' ? view.template : view.limits);
  const errors = result && 'errors' in result ? result.errors : {};
  const source =
    draft?.kind === 'template'
      ? 'Back to the template when saved'
      : draft
        ? 'Changed, not saved yet'
        : view.source === 'tank'
          ? Object.values(view.limits ?? {}).every((v) => v === null)
            ? 'Not watched on this tank'
            : "This tank's own limits"
          : view.source === 'template'
            ? 'Template default (common practice)'
            : 'No limits: not watched';
  const current = (): ParameterLimits | null => {
    if (result && 'limits' in result) return result.limits;
    return view.limits;
  };

  return (
    <li className="rounded-lg border border-ink-100 p-3" data-testid={`limits-${parameter}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h4 className="font-bold text-ink-900">
          {info.label}
          {info.symbol && <span className="font-normal text-ink-700"> ({info.symbol})</span>}
        </h4>
        <span className="text-sm text-ink-700">{source}</span>
      </div>
      <div className="mt-2 grid grid-cols-2 gap-2 sm:grid-cols-4">
        {bounds.map((bound) => {
          const inputId = `${id}-${bound}`;
          const error = errors[bound] ?? serverIssues[`${parameter}.${bound}`];
          return (
            <div key={bound}>
              <label htmlFor={inputId} className="block text-xs font-bold text-ink-800">
                {boundLabels[bound]}
              </label>
              <input
                id={inputId}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                value={text[bound]}
                placeholder="none"
                onChange={(event) =>
                  onDraft({ kind: 'bounds', text: { ...text, [bound]: event.target.value } })
                }
                aria-invalid={error ? true : undefined}
                aria-describedby={error ? `${inputId}-error` : undefined}
                className={`mt-1 min-h-11 w-full rounded-lg border-2 bg-white px-2 text-base ${
                  error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
                }`}
              />
              {error && (
                <p id={`${inputId}-error`} className="mt-1 text-xs font-bold text-alert-700">
                  ! {error}
                </p>
              )}
            </div>
          );
        })}
      </div>
      <div className="mt-2 grid gap-1 text-sm text-ink-700 sm:grid-cols-2">
        <p>
          Template: warning{' '}
          {range(parameter, view.template?.warnLow ?? null, view.template?.warnHigh ?? null)}, critical{' '}
          {range(parameter, view.template?.critLow ?? null, view.template?.critHigh ?? null)}
        </p>
        {view.comfort ? (
          <p>
            Comfort range:{' '}
            <strong className="text-ink-900">{range(parameter, view.comfort.min, view.comfort.max)}</strong>
            {view.comfort.limitedBy.low.length + view.comfort.limitedBy.high.length > 0 && (
              <>
                {' '}
                (set by{' '}
                {[...new Set([...view.comfort.limitedBy.low, ...view.comfort.limitedBy.high])].join(', ')})
              </>
            )}
          </p>
        ) : view.comfortConflict ? (
          <p className="font-bold text-watch-700">{view.comfortConflict}</p>
        ) : (
          <p>No comfort range from the livestock.</p>
        )}
      </div>
      <div className="mt-2 flex flex-wrap gap-2">
        {view.comfort && (
          <Button
            tone="secondary"
            className="text-sm"
            onClick={() =>
              onDraft({ kind: 'bounds', text: textOf(limitsFromComfort(current(), view.comfort!)) })
            }
          >
            Use comfort range<span className="sr-only"> for {info.label}</span>
          </Button>
        )}
        {view.template && view.source === 'tank' && draft?.kind !== 'template' && (
          <Button tone="secondary" className="text-sm" onClick={() => onDraft({ kind: 'template' })}>
            Use template<span className="sr-only"> for {info.label}</span>
          </Button>
        )}
        {draft && (
          <Button tone="secondary" className="text-sm" onClick={() => onDraft(undefined)}>
            Undo<span className="sr-only"> {info.label}</span>
          </Button>
        )}
      </div>
    </li>
  );
}

import { useId, useState } from 'react';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { formatValue } from '@shared/parameters/units';
import { limitsFromComfort } from '@shared/readings/comfort-limits';
import { tankRateRule, type ParameterLimitsView, type TankRateRule } from '@shared/schemas/limits';
import { parameterLimits, type ParameterLimits } from '@shared/parameters/limits';
import { Button } from '../../../components/button';
import { ErrorState, LoadingState } from '../../../components/states';
import { ApiError } from '../../../lib/api-client';
import { parseDecimal } from '../../../lib/decimal';
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

const rateFields = ['maxChange', 'perHours'] as const;
type RateField = (typeof rateFields)[number];

/** The fast-change rule being edited for one parameter: two typed numbers, or "back to the default". */
type RateDraft = { kind: 'rule'; text: Record<RateField, string> } | { kind: 'default' };
type RateResult = { rate: TankRateRule | null } | { errors: Partial<Record<RateField, string>> };

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

const rateTextOf = (rule: TankRateRule | null): Record<RateField, string> => ({
  maxChange: rule ? String(rule.maxChange) : '',
  perHours: rule ? String(rule.perHours) : '',
});

/** Both numbers empty means the default rule; one alone is a rule half typed. */
function rateFromText(text: Record<RateField, string>): RateResult {
  const errors: Partial<Record<RateField, string>> = {};
  const values: Partial<Record<RateField, number>> = {};
  for (const field of rateFields) {
    const parsed = parseDecimal(text[field]);
    if (parsed.state === 'invalid') errors[field] = parsed.reason;
    else if (parsed.state === 'number') values[field] = parsed.value;
  }
  if (Object.keys(errors).length > 0) return { errors };
  if (values.maxChange === undefined && values.perHours === undefined) return { rate: null };
  for (const field of rateFields) {
    if (values[field] === undefined) errors[field] = 'Enter both numbers, or use the default.';
  }
  if (Object.keys(errors).length > 0) return { errors };
  const checked = tankRateRule.safeParse(values);
  if (!checked.success) {
    for (const issue of checked.error.issues) errors[issue.path[0] as RateField] = issue.message;
    return { errors };
  }
  return { rate: checked.data };
}

const sameLimits = (a: ParameterLimits | null, b: ParameterLimits | null): boolean =>
  a !== null && b !== null && bounds.every((bound) => a[bound] === b[bound]);

function amountOf(parameter: ParameterKey, amount: number): string {
  const { symbol } = parameterCatalogue[parameter];
  return symbol ? `${amount} ${symbol}` : String(amount);
}

const hours = (amount: number) => `${amount} hour${amount === 1 ? '' : 's'}`;

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
  const [rateDrafts, setRateDrafts] = useState<Partial<Record<ParameterKey, RateDraft>>>({});
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
  const changedRates = Object.entries(rateDrafts) as [ParameterKey, RateDraft][];
  const rateResults = new Map(
    changedRates.map(([parameter, draft]) => [
      parameter,
      draft.kind === 'rule' ? rateFromText(draft.text) : { rate: null },
    ]),
  );
  const invalid =
    [...results.values()].some((result) => result !== null && 'errors' in result) ||
    [...rateResults.values()].some((result) => 'errors' in result);
  const changes = new Set([...changed, ...changedRates].map(([parameter]) => parameter)).size;

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

  const setRateDraft = (parameter: ParameterKey, draft: RateDraft | undefined) => {
    setSaved(false);
    setServerIssues({});
    setRateDrafts((current) => {
      const next = { ...current };
      if (draft) next[parameter] = draft;
      else delete next[parameter];
      return next;
    });
  };

  const undoAll = () => {
    setDrafts({});
    setRateDrafts({});
  };

  const save = () => {
    if (invalid || changes === 0) return;
    const limitsBody: Partial<Record<ParameterKey, ParameterLimits | null>> = {};
    for (const [parameter, draft] of changed) {
      const result = results.get(parameter);
      limitsBody[parameter] =
        draft.kind === 'template' ? null : result && 'limits' in result ? result.limits : null;
    }
    const ratesBody: Partial<Record<ParameterKey, TankRateRule | null>> = {};
    for (const [parameter] of changedRates) {
      const result = rateResults.get(parameter);
      ratesBody[parameter] = result && 'rate' in result ? result.rate : null;
    }
    update.mutate(
      { limits: limitsBody, rates: ratesBody },
      {
        onSuccess: () => {
          undoAll();
          setSaved(true);
        },
        onError: (error) => {
          if (!(error instanceof ApiError)) return;
          setServerIssues(
            Object.fromEntries(
              error.issues.map((issue) => [issue.path.replace(/^body\./, ''), issue.message]),
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
      <p className="mt-1 text-sm text-ink-700">
        A fast-change rule opens a warning when a parameter moves by more than the amount set within the hours
        set, even inside its limits. The defaults are common practice, not a standard; change them for a tank
        that needs a gentler or a looser rule.
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
            rateDraft={rateDrafts[p.parameter]}
            rateResult={rateResults.get(p.parameter)}
            serverIssues={serverIssues}
            onDraft={(draft) => setDraft(p.parameter, draft)}
            onRateDraft={(draft) => setRateDraft(p.parameter, draft)}
          />
        ))}
      </ul>

      <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-ink-100 pt-4">
        <Button onClick={save} disabled={changes === 0 || invalid || update.isPending}>
          {update.isPending
            ? 'Saving…'
            : changes > 0
              ? `Save ${changes} change${changes === 1 ? '' : 's'}`
              : 'No changes'}
        </Button>
        {changes > 0 && (
          <Button tone="secondary" onClick={undoAll}>
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
  rateDraft: RateDraft | undefined;
  rateResult: RateResult | undefined;
  serverIssues: Record<string, string>;
  onDraft: (draft: Draft | undefined) => void;
  onRateDraft: (draft: RateDraft | undefined) => void;
}

function LimitRow({
  view,
  draft,
  result,
  rateDraft,
  rateResult,
  serverIssues,
  onDraft,
  onRateDraft,
}: LimitRowProps) {
  const id = useId();
  const { parameter } = view;
  const info = parameterCatalogue[parameter];
  const text =
    draft?.kind === 'bounds' ? draft.text : textOf(draft?.kind === 'template' ? view.template : view.limits);
  const errors = result && 'errors' in result ? result.errors : {};
  // A rate rule keeps the template's values on the tank, so "Use template" would change nothing.
  const likeTemplate = view.source === 'tank' && sameLimits(view.limits, view.template);
  const source =
    draft?.kind === 'template'
      ? 'Back to the template when saved'
      : draft
        ? 'Changed, not saved yet'
        : view.source === 'tank'
          ? Object.values(view.limits ?? {}).every((v) => v === null)
            ? 'Not watched on this tank'
            : likeTemplate
              ? "This tank's own limits, the same as the template"
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
          const error = errors[bound] ?? serverIssues[`limits.${parameter}.${bound}`];
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
      <RateRuleFields
        view={view}
        draft={rateDraft}
        result={rateResult}
        serverIssues={serverIssues}
        onDraft={onRateDraft}
      />
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
        {view.template && view.source === 'tank' && !likeTemplate && draft?.kind !== 'template' && (
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

interface RateRuleFieldsProps {
  view: ParameterLimitsView;
  draft: RateDraft | undefined;
  result: RateResult | undefined;
  serverIssues: Record<string, string>;
  onDraft: (draft: RateDraft | undefined) => void;
}

/** "Alert on fast change: more than [x] [unit] within [y] hours", with the default beside it. */
function RateRuleFields({ view, draft, result, serverIssues, onDraft }: RateRuleFieldsProps) {
  const id = useId();
  const { parameter, rate, defaultRate } = view;
  const info = parameterCatalogue[parameter];
  const text =
    draft?.kind === 'rule'
      ? draft.text
      : rateTextOf(draft?.kind === 'default' ? defaultRate : (rate ?? defaultRate));
  const errors = result && 'errors' in result ? result.errors : {};
  const status =
    draft?.kind === 'default'
      ? 'Back to the default when saved'
      : draft
        ? 'Changed, not saved yet'
        : rate
          ? "This tank's own rule"
          : defaultRate
            ? 'Default (common practice)'
            : 'No rule: not checked';
  const defaultText = defaultRate
    ? `more than ${amountOf(parameter, defaultRate.maxChange)} within ${hours(defaultRate.perHours)}`
    : 'none for this parameter';
  const labels: Record<RateField, string> = { maxChange: 'more than', perHours: 'within' };
  const after: Record<RateField, string> = { maxChange: info.symbol, perHours: 'hours' };
  const issueFor = (field: RateField) => errors[field] ?? serverIssues[`rates.${parameter}.${field}`];

  return (
    <fieldset className="mt-3 border-t border-ink-100 pt-2">
      <legend className="flex w-full flex-wrap items-baseline justify-between gap-2 text-sm">
        <span className="font-bold text-ink-900">
          Alert on fast change<span className="sr-only"> in {info.label}</span>
        </span>
        <span className="text-ink-700">{status}</span>
      </legend>
      <div className="mt-1 flex flex-wrap items-center gap-x-2 gap-y-1 text-sm text-ink-800">
        {rateFields.map((field) => {
          const inputId = `${id}-${field}`;
          const error = issueFor(field);
          return (
            <span key={field} className="inline-flex items-center gap-2">
              <label htmlFor={inputId}>{labels[field]}</label>
              <input
                id={inputId}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                value={text[field]}
                placeholder="none"
                onChange={(event) =>
                  onDraft({ kind: 'rule', text: { ...text, [field]: event.target.value } })
                }
                aria-invalid={error ? true : undefined}
                aria-describedby={error ? `${inputId}-error` : undefined}
                className={`min-h-11 w-20 rounded-lg border-2 bg-white px-2 text-base ${
                  error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
                }`}
              />
              {after[field] && <span>{after[field]}</span>}
            </span>
          );
        })}
      </div>
      {rateFields.map((field) => {
        const error = issueFor(field);
        return (
          error && (
            <p key={field} id={`${id}-${field}-error`} className="mt-1 text-xs font-bold text-alert-700">
              ! {error}
            </p>
          )
        );
      })}
      <div className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-700">
        <p>Default (common practice): {defaultText}.</p>
        {(rate !== null || draft?.kind === 'rule') && draft?.kind !== 'default' && (
          <Button
            tone="secondary"
            className="text-sm"
            onClick={() => onDraft(rate ? { kind: 'default' } : undefined)}
          >
            Use default<span className="sr-only"> fast-change rule for {info.label}</span>
          </Button>
        )}
        {draft && rate !== null && (
          <Button tone="secondary" className="text-sm" onClick={() => onDraft(undefined)}>
            Undo<span className="sr-only"> fast-change rule for {info.label}</span>
          </Button>
        )}
      </div>
    </fieldset>
  );
}

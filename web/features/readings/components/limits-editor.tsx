import { useEffect } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { parameterLimits, type ParameterLimits } from '@shared/parameters/limits';
import { formatValue } from '@shared/parameters/units';
import { limitsFromComfort } from '@shared/readings/comfort-limits';
import {
  tankRateRule,
  type ParameterLimitsView,
  type TankLimitsView,
  type TankRateRule,
  type UpdateLimitsInput,
} from '@shared/schemas/limits';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { DecimalField } from '../../../components/form-fields';
import { ErrorState, LoadingState } from '../../../components/states';
import { decimalText } from '../../../lib/form-values';
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

const rateFields = ['maxChange', 'perHours'] as const;
type RateField = (typeof rateFields)[number];

const bound = decimalText(z.number().optional());

/**
 * The shared rule names bounds by their keys ("critHigh must be at or above warnHigh"); under a
 * field the technician reads the labels they typed into instead.
 */
const inLabels = (message: string) =>
  message.replace(
    /^(critLow|warnLow|warnHigh|critHigh) must be (.+) (critLow|warnLow|warnHigh|critHigh)$/,
    (_, __, relation: string, other: Bound) => `Must be ${relation} “${boundLabels[other]}”.`,
  );

/** One parameter's four typed bounds, or "back to the template" (null), checked by the shared rule. */
const limitsRow = z
  .object({ useTemplate: z.boolean(), critLow: bound, warnLow: bound, warnHigh: bound, critHigh: bound })
  .transform(({ useTemplate, critLow, warnLow, warnHigh, critHigh }, context) => {
    if (useTemplate) return null;
    const checked = parameterLimits.safeParse({
      critLow: critLow ?? null,
      warnLow: warnLow ?? null,
      warnHigh: warnHigh ?? null,
      critHigh: critHigh ?? null,
    });
    if (checked.success) return checked.data;
    for (const issue of checked.error.issues) {
      context.addIssue({ code: 'custom', path: issue.path, message: inLabels(issue.message) });
    }
    return z.NEVER;
  });

/** One parameter's fast-change rule: both numbers, or neither (the default, null). */
const rateRow = z
  .object({ useDefault: z.boolean(), maxChange: bound, perHours: bound })
  .transform(({ useDefault, maxChange, perHours }, context) => {
    if (useDefault || (maxChange === undefined && perHours === undefined)) return null;
    if (maxChange === undefined || perHours === undefined) {
      for (const [field, value] of [
        ['maxChange', maxChange],
        ['perHours', perHours],
      ] as const) {
        if (value === undefined) {
          context.addIssue({
            code: 'custom',
            path: [field],
            message: 'Enter both numbers, or use the default.',
          });
        }
      }
      return z.NEVER;
    }
    return { maxChange, perHours };
  })
  .pipe(tankRateRule.nullable());

const limitsForm = z.object({
  limits: z.partialRecord(z.string(), limitsRow),
  rates: z.partialRecord(z.string(), rateRow),
});
type LimitsFormValues = z.input<typeof limitsForm>;
type LimitsText = z.input<typeof limitsRow>;
type RateText = z.input<typeof rateRow>;

const text = (value: number | null | undefined) => (value == null ? '' : String(value));

const limitsTextOf = (limits: ParameterLimits | null, useTemplate = false): LimitsText => ({
  useTemplate,
  critLow: text(limits?.critLow),
  warnLow: text(limits?.warnLow),
  warnHigh: text(limits?.warnHigh),
  critHigh: text(limits?.critHigh),
});

const rateTextOf = (rule: TankRateRule | null, useDefault = false): RateText => ({
  useDefault,
  maxChange: text(rule?.maxChange),
  perHours: text(rule?.perHours),
});

/** The form as the saved limits stand: each parameter's own bounds and rule, or the defaults. */
function savedValues(view: TankLimitsView): LimitsFormValues {
  return {
    limits: Object.fromEntries(view.parameters.map((p) => [p.parameter, limitsTextOf(p.limits)])),
    rates: Object.fromEntries(view.parameters.map((p) => [p.parameter, rateTextOf(p.rate ?? p.defaultRate)])),
  };
}

const sameText = <T extends object>(a: T | undefined, b: T | undefined) =>
  a !== undefined && b !== undefined && (Object.keys(a) as (keyof T)[]).every((key) => a[key] === b[key]);

const sameLimits = (a: ParameterLimits | null, b: ParameterLimits | null): boolean =>
  a !== null && b !== null && bounds.every((key) => a[key] === b[key]);

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
  if (limits.isPending) return <LoadingState label="Loading limits…" />;
  if (limits.isError)
    return <ErrorState error={limits.error} what="the limits" onRetry={() => void limits.refetch()} />;
  return <LimitsForm tankId={tankId} view={limits.data} />;
}

function LimitsForm({ tankId, view }: { tankId: string; view: TankLimitsView }) {
  const update = useUpdateLimits(tankId);
  const saved = savedValues(view);
  // The saved limits come back from the API after a save; the form then starts again from them.
  const form = useZodForm(limitsForm, { mode: 'onChange', values: saved });
  const values = useWatch({ control: form.control }) as LimitsFormValues;
  const { errors } = form.formState;

  // Typing a bound after "Use template" edits the bounds instead; likewise for the default rule.
  useEffect(() => {
    const { unsubscribe } = form.watch((_, { name, type }) => {
      const match = /^(limits|rates)\.(\w+)\.(\w+)$/.exec(name ?? '');
      if (type !== 'change' || !match) return;
      const [, group, parameter] = match;
      if (group === 'limits') form.setValue(`limits.${parameter}.useTemplate`, false);
      else form.setValue(`rates.${parameter}.useDefault`, false);
      // A bound's problem may lie in another bound of the row (warning above critical), so all are checked.
      void form.trigger(`${group === 'limits' ? 'limits' : 'rates'}.${parameter}`);
    });
    return unsubscribe;
  }, [form]);

  const changedLimits = view.parameters
    .map((p) => p.parameter)
    .filter((parameter) => !sameText(values.limits?.[parameter], saved.limits[parameter]));
  const changedRates = view.parameters
    .map((p) => p.parameter)
    .filter((parameter) => !sameText(values.rates?.[parameter], saved.rates[parameter]));
  const changes = new Set([...changedLimits, ...changedRates]).size;
  const invalid = errors.limits !== undefined || errors.rates !== undefined;

  return (
    <section aria-labelledby="limits-title" className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <h3 id="limits-title" className="text-xl font-bold text-ink-900">
        Limits
      </h3>
      <p className="mt-1 text-sm text-ink-700">
        A reading strictly beyond a bound opens a warning or critical alert; leave a bound empty for no limit
        on that side. Values are in each parameter&apos;s stored unit. Template limits are starting points
        chosen by the Brinewatch team, not a published standard: adjust them for each tank and what lives in
        it.
      </p>
      <p className="mt-1 text-sm text-ink-700">
        A fast-change rule opens a warning when a parameter moves by more than the amount set within the hours
        set, even inside its limits. The defaults are common practice, not a standard; change them for a tank
        that needs a gentler or a looser rule.
      </p>
      {view.inhabitants > 0 ? (
        <p className="mt-1 text-sm text-ink-700">
          Comfort ranges come from the care profiles of the {view.inhabitants} kinds of livestock in the tank
          now. Care profiles are general guidance, not measured data: individual animals and tanks differ.
        </p>
      ) : (
        <p className="mt-1 text-sm text-ink-700">
          No livestock recorded yet, so there is no comfort range to compare.
        </p>
      )}

      <Form
        form={form}
        onSubmit={async (parsed) => {
          const body: UpdateLimitsInput = {
            limits: Object.fromEntries(changedLimits.map((p) => [p, parsed.limits[p] ?? null])),
            rates: Object.fromEntries(changedRates.map((p) => [p, parsed.rates[p] ?? null])),
          };
          await update.mutateAsync(body);
        }}
      >
        <ul className="mt-4 space-y-3">
          {view.parameters.map((p) => (
            <LimitRow
              key={p.parameter}
              view={p}
              changed={changedLimits.includes(p.parameter)}
              rateChanged={changedRates.includes(p.parameter)}
              saved={saved}
            />
          ))}
        </ul>

        <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-ink-100 pt-4">
          <SubmitButton pending="Saving…" disabled={changes === 0 || invalid}>
            {changes > 0 ? `Save ${changes} change${changes === 1 ? '' : 's'}` : 'No changes'}
          </SubmitButton>
          {changes > 0 && (
            <Button tone="secondary" onClick={() => form.reset(saved)}>
              Undo changes
            </Button>
          )}
          {invalid && <p className="font-bold text-alert-700">Fix the marked limits first.</p>}
          {update.isSuccess && changes === 0 && (
            <p role="status" className="font-bold text-healthy-700">
              ✓ Limits saved.
            </p>
          )}
          <FormProblem className="font-bold" />
        </div>
      </Form>
    </section>
  );
}

interface LimitRowProps {
  view: ParameterLimitsView;
  changed: boolean;
  rateChanged: boolean;
  saved: LimitsFormValues;
}

function LimitRow({ view, changed, rateChanged, saved }: LimitRowProps) {
  const { parameter } = view;
  const info = parameterCatalogue[parameter];
  const { setValue } = useFormContext<LimitsFormValues>();
  const typed = useWatch<LimitsFormValues>({ name: `limits.${parameter}` }) as LimitsText | undefined;
  const useTemplate = typed?.useTemplate === true;
  // A rate rule keeps the template's values on the tank, so "Use template" would change nothing.
  const likeTemplate = view.source === 'tank' && sameLimits(view.limits, view.template);
  const source = useTemplate
    ? 'Back to the template when saved'
    : changed
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
  const set = (next: LimitsText) =>
    setValue(`limits.${parameter}`, next, { shouldDirty: true, shouldValidate: true });
  const current = (): ParameterLimits | null => {
    const read = limitsRow.safeParse(typed);
    return read.success && read.data ? read.data : view.limits;
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
        {bounds.map((key) => (
          <DecimalField<LimitsFormValues>
            key={key}
            name={`limits.${parameter}.${key}`}
            label={boundLabels[key]}
            placeholder="none"
          />
        ))}
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
      <RateRuleFields view={view} changed={rateChanged} saved={saved} />
      <div className="mt-2 flex flex-wrap gap-2">
        {view.comfort && (
          <Button
            tone="secondary"
            className="text-sm"
            onClick={() => set(limitsTextOf(limitsFromComfort(current(), view.comfort!)))}
          >
            Use comfort range<span className="sr-only"> for {info.label}</span>
          </Button>
        )}
        {view.template && view.source === 'tank' && !likeTemplate && !useTemplate && (
          <Button tone="secondary" className="text-sm" onClick={() => set(limitsTextOf(view.template, true))}>
            Use template<span className="sr-only"> for {info.label}</span>
          </Button>
        )}
        {changed && (
          <Button tone="secondary" className="text-sm" onClick={() => set(saved.limits[parameter]!)}>
            Undo<span className="sr-only"> {info.label}</span>
          </Button>
        )}
      </div>
    </li>
  );
}

/** "Alert on fast change: more than [x] [unit] within [y] hours", with the default beside it. */
function RateRuleFields({
  view,
  changed,
  saved,
}: {
  view: ParameterLimitsView;
  changed: boolean;
  saved: LimitsFormValues;
}) {
  const { parameter, rate, defaultRate } = view;
  const info = parameterCatalogue[parameter];
  const { setValue } = useFormContext<LimitsFormValues>();
  const typed = useWatch<LimitsFormValues>({ name: `rates.${parameter}` }) as RateText | undefined;
  const useDefault = typed?.useDefault === true;
  const status = useDefault
    ? 'Back to the default when saved'
    : changed
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
  const set = (next: RateText) =>
    setValue(`rates.${parameter}`, next, { shouldDirty: true, shouldValidate: true });

  return (
    <fieldset className="mt-3 border-t border-ink-100 pt-2">
      <legend className="flex w-full flex-wrap items-baseline justify-between gap-2 text-sm">
        <span className="font-bold text-ink-900">
          Alert on fast change<span className="sr-only"> in {info.label}</span>
        </span>
        <span className="text-ink-700">{status}</span>
      </legend>
      <div className="mt-1 grid grid-cols-2 gap-2 text-sm text-ink-800 sm:max-w-md">
        {rateFields.map((field) => (
          <DecimalField<LimitsFormValues>
            key={field}
            name={`rates.${parameter}.${field}`}
            label={labels[field]}
            placeholder="none"
            suffix={after[field] || undefined}
          />
        ))}
      </div>
      <div className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-700">
        <p>Default (common practice): {defaultText}.</p>
        {(rate !== null || changed) && !useDefault && (
          <Button
            tone="secondary"
            className="text-sm"
            onClick={() => set(rate ? rateTextOf(defaultRate, true) : saved.rates[parameter]!)}
          >
            Use default<span className="sr-only"> fast-change rule for {info.label}</span>
          </Button>
        )}
        {changed && rate !== null && (
          <Button tone="secondary" className="text-sm" onClick={() => set(saved.rates[parameter]!)}>
            Undo<span className="sr-only"> fast-change rule for {info.label}</span>
          </Button>
        )}
      </div>
    </fieldset>
  );
}

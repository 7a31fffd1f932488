import { z } from 'zod';
import {
  concentrationAfterWaterChanges,
  waterChangeFractionFor,
  waterChangesNeeded,
} from '@shared/chemistry/index';
import { Form } from '../../../components/form';
import { DecimalField } from '../../../components/form-fields';
import {
  entry,
  filledIn,
  problemsAt,
  resultIsLive,
  useCalculatorForm,
  type Outcome,
} from '../utils/calculator-form';
import { formatFixed } from '../../../lib/format';
import { formatPlain } from '../utils/format-number';
import { attempt, type ArgumentMap } from '../utils/range-message';
import { CalculatorCard } from './calculator-card';
import { ResultList, ResultPanel, ResultValue } from './result-panel';
import { SourceNote } from './source-note';
import { UnitLabel, UnitSuffix } from './unit-label';

type Field = 'current' | 'target' | 'replacement' | 'percent';

/** Rows shown before the table skips to the last change. */
const shownRows = 10;

interface Plan {
  changes: number;
  percent: number;
  rows: { change: number; value: number }[];
  /** Size of one change that would reach the target at once, when more than one change is needed. */
  singlePercent?: number;
}

const args: ArgumentMap<Field> = {
  c0: { field: 'current', label: 'Current reading' },
  target: { field: 'target', label: 'Target' },
  replacementConc: { field: 'replacement', label: 'New water’s reading' },
  fraction: { field: 'percent', label: 'Change size', unit: '%', fromModule: (fraction) => fraction * 100 },
};

/** Why the module refused a target, said with the person's own numbers. */
function unreachable(current: number, target: number, replacement: number): string {
  const [low, high] = [Math.min(current, replacement), Math.max(current, replacement)].map((n) =>
    formatPlain(n),
  );
  if (target === replacement) {
    return `Water changes only ever approach the new water’s ${formatPlain(replacement)}; they never reach it exactly. Aim a little ${current > replacement ? 'above' : 'below'} it.`;
  }
  return `Water changes can’t reach ${formatPlain(target)}: each change moves the reading towards the new water’s ${formatPlain(replacement)}, so it can only land between ${low} and ${high}.`;
}

function planChanges(current: number, target: number, replacement: number, percent: number) {
  const fraction = percent / 100;
  const checked = attempt(() => {
    concentrationAfterWaterChanges(current, replacement, fraction, 0);
    return waterChangesNeeded(current, target, replacement, fraction);
  }, args);
  if (!checked.ok)
    return checked.field ? checked : { ...checked, message: unreachable(current, target, replacement) };
  const changes = checked.value;
  const numbers = Array.from({ length: Math.min(changes, shownRows) }, (_, index) => index + 1);
  if (changes > shownRows) numbers.push(changes);
  const plan: Plan = {
    changes,
    percent,
    rows: numbers.map((change) => ({
      change,
      value: concentrationAfterWaterChanges(current, replacement, fraction, change),
    })),
    singlePercent: changes > 1 ? waterChangeFractionFor(current, target, replacement) * 100 : undefined,
  };
  return { ok: true as const, value: plan };
}

const waterChangeForm = z
  .object({ current: entry, target: entry, replacement: entry, percent: entry })
  .transform((entries, context): Outcome<Plan> => {
    const read = filledIn<Field>(entries, {
      current: 'Current reading',
      target: 'Target',
      replacement: 'New water’s reading',
      percent: 'Change size',
    });
    if (!read.ok) return { status: { kind: 'missing', labels: read.missing } };
    const { values } = read;
    const worked = planChanges(values.current, values.target, values.replacement, values.percent);
    if (worked.ok) return { status: { kind: 'ready' }, result: worked.value };
    if (worked.field) return problemsAt(context, { [worked.field]: worked.message });
    return { status: { kind: 'problem', message: worked.message } };
  });
type WaterChangeValues = z.input<typeof waterChangeForm>;

export function WaterChangeCalculator() {
  const { form, outcome } = useCalculatorForm(waterChangeForm, {
    current: '40',
    target: '20',
    replacement: '0',
    percent: '20',
  });
  const plan = outcome.result;

  return (
    <CalculatorCard
      id="water-change"
      title="Water change planner"
      intro="How many water changes bring a reading to your target — nitrate, phosphate, salinity or anything else a change dilutes. Use one unit for all three readings."
    >
      <Form form={form} onSubmit={resultIsLive} className="grid gap-5 sm:grid-cols-2">
        <DecimalField<WaterChangeValues> name="current" label="Current reading" />
        <DecimalField<WaterChangeValues> name="target" label="Target" />
        <DecimalField<WaterChangeValues>
          name="replacement"
          label="New water’s reading"
          hint="The same reading in the water you add; 0 for most nutrients in purified water."
        />
        <DecimalField<WaterChangeValues>
          name="percent"
          label={
            <UnitLabel unit="%" spoken="percent of the tank">
              Change size
            </UnitLabel>
          }
          suffix={<UnitSuffix unit="%" />}
          hint="Share of the system’s water replaced each time."
        />
      </Form>
      <ResultPanel
        status={outcome.status}
        source={
          <SourceNote>
            <p>
              Mass balance: after n changes of a share f, reading = new + (start − new) × (1 − f)ⁿ. Assumes
              the water mixes fully between changes and nothing is added or used up meanwhile.
            </p>
          </SourceNote>
        }
      >
        {plan && (
          <div className="space-y-4">
            <ResultList>
              <ResultValue
                label="Changes needed"
                detail={
                  plan.changes === 0
                    ? 'already at or past the target'
                    : `of ${formatPlain(plan.percent)} % each`
                }
                value={String(plan.changes)}
                testId="water-change-count"
              />
            </ResultList>
            {plan.singlePercent !== undefined && (
              <p className="text-sm text-ink-900" data-testid="water-change-single">
                One change of {formatFixed(plan.singlePercent, 1)} % would reach the target at once, but
                smaller, regular changes are gentler: a big change swings every other reading with it.
              </p>
            )}
            {plan.rows.length > 0 && (
              <table className="w-full border-collapse text-left">
                <caption className="mb-2 text-left text-sm font-bold text-ink-700">
                  Reading after each change
                </caption>
                <thead>
                  <tr className="border-b-2 border-ink-300">
                    <th scope="col" className="py-2 pr-4 font-bold text-ink-900">
                      Change
                    </th>
                    <th scope="col" className="py-2 text-right font-bold text-ink-900">
                      Reading after
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {plan.rows.map((row, index) => (
                    <tr key={row.change} className="border-b border-ink-100">
                      <th scope="row" className="py-2 pr-4 font-normal text-ink-900">
                        {index === shownRows && <span className="mr-1 text-ink-700">…</span>}
                        {row.change}
                      </th>
                      <td className="py-2 text-right font-bold tabular-nums text-ink-950">
                        {formatFixed(row.value, 2)}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </div>
        )}
      </ResultPanel>
    </CalculatorCard>
  );
}

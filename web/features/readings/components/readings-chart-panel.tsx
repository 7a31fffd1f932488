import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import { z } from 'zod';
import { joinWithAnd } from '@shared/livestock/comfort-range';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKey, type ParameterKey } from '@shared/parameters/keys';
import { readingSourceLabels } from '@shared/readings/source-labels';
import { Form, useZodForm } from '../../../components/form';
import { SelectField } from '../../../components/form-fields';
import { RadioGroup } from '../../../components/radio-group';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { formatCount } from '../../../lib/format';
import { useComfortRange } from '../../../lib/queries/comfort-range';
import { useReadingHistory } from '../api/get-reading-history';
import { chartRangeKeys, chartRanges, type ChartRange } from '../utils/chart-ranges';
import { unitOptions } from '../utils/display-units';
import { limitsSummary, rangeSummary } from '../utils/limits-text';
import { ReadingsTable } from './readings-table';
import { WindowStats } from './window-stats';

// chart.js and its date adapter load only when a chart is first shown.
const ReadingsChart = lazy(async () => ({ default: (await import('./readings-chart')).ReadingsChart }));

/** What the chart shows; the tank's page holds the choice, as the latest-reading tiles choose too. */
const chartChoice = z.object({ parameter: parameterKey, unit: z.string() });
type ChartChoice = z.infer<typeof chartChoice>;

interface ReadingsChartPanelProps {
  tankId: string;
  parameters: ParameterKey[];
  parameter: ParameterKey;
  onParameterChange: (parameter: ParameterKey) => void;
  unit: string;
  onUnitChange: (unit: string) => void;
  canImport: boolean;
  defaultImportSource: 'visit' | 'home-test';
}

export function ReadingsChartPanel(props: ReadingsChartPanelProps) {
  const { tankId, parameters, parameter, onParameterChange, unit, onUnitChange } = props;
  const [range, setRange] = useState<ChartRange>('7d');
  const [view, setView] = useState<'chart' | 'table'>('chart');
  const history = useReadingHistory({ tankId, parameter, range });
  const choice = useZodForm(chartChoice, { values: { parameter, unit } });
  // A choice made here goes up to the page; a choice made there comes back through `values`.
  useEffect(() => {
    const { unsubscribe } = choice.watch((chosen, { name, type }) => {
      if (type !== 'change') return;
      if (name === 'parameter' && chosen.parameter) onParameterChange(chosen.parameter);
      if (name === 'unit' && chosen.unit) onUnitChange(chosen.unit);
    });
    return unsubscribe;
  }, [choice, onParameterChange, onUnitChange]);
  const label = parameterCatalogue[parameter].label;
  const units = unitOptions(parameter);
  // What the livestock tolerate together is drawn too: a tank's limits can be wider than that, and
  // its status judges both. Without it (still loading, or not to be had) the chart draws the limits.
  const comfort = useComfortRange(tankId);
  const tolerated = useMemo(() => {
    const band = comfort.data?.ranges[parameter];
    if (!band) return null;
    const ids = new Set([...band.limitedBy.low, ...band.limitedBy.high]);
    const species = (comfort.data?.species ?? []).filter((entry) => ids.has(entry.id));
    return { min: band.min, max: band.max, species: species.map((entry) => entry.commonName) };
  }, [comfort.data, parameter]);

  return (
    <section aria-labelledby="history-title" className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h3 id="history-title" className="text-xl font-bold text-ink-900">
          History
        </h3>
        <RadioGroup
          look="compact"
          legend="Show as"
          hideLegend
          value={view}
          onChange={setView}
          options={[
            { value: 'chart', label: 'Chart' },
            { value: 'table', label: 'Table' },
          ]}
        />
      </div>

      {view === 'table' ? (
        <div className="mt-4">
          <ReadingsTable
            tankId={tankId}
            parameters={parameters}
            initialParameter={parameter}
            canImport={props.canImport}
            defaultImportSource={props.defaultImportSource}
          />
        </div>
      ) : (
        <>
          <Form
            form={choice}
            // Each choice applies as it is made; there is nothing to send.
            onSubmit={() => undefined}
            className="mt-4 grid gap-4 md:grid-cols-[minmax(0,14rem)_1fr_minmax(0,14rem)] md:items-end"
          >
            <SelectField<ChartChoice>
              name="parameter"
              label="Parameter"
              options={parameters.map((key) => ({ value: key, label: parameterCatalogue[key].label }))}
            />
            <RadioGroup
              look="compact"
              legend="Period"
              value={range}
              onChange={setRange}
              options={chartRangeKeys.map((key) => ({ value: key, label: chartRanges[key].label }))}
            />
            {units.length > 1 ? (
              <SelectField<ChartChoice> name="unit" label="Unit" options={units} />
            ) : (
              <div aria-hidden="true" />
            )}
          </Form>

          <div className="mt-5">
            {history.isPending ? (
              <LoadingState label={`Loading ${label.toLowerCase()} history…`} />
            ) : history.isError ? (
              <ErrorState error={history.error} what="this history" onRetry={() => void history.refetch()} />
            ) : history.data.total === 0 ? (
              <EmptyState title={`No ${label.toLowerCase()} readings in the ${chartRanges[range].spoken}`}>
                Try a longer period, or add a reading below.
              </EmptyState>
            ) : (
              <div className="grid gap-5 lg:grid-cols-[1fr_13rem]">
                <figure className="min-w-0">
                  <div className="relative h-72 sm:h-96" data-testid="readings-chart">
                    <Suspense fallback={<LoadingState label="Drawing the chart…" />}>
                      <ReadingsChart
                        parameter={parameter}
                        unit={unit}
                        history={history.data}
                        tolerated={tolerated}
                      />
                    </Suspense>
                  </div>
                  <figcaption className="mt-3 text-sm text-ink-700">
                    {label} over the {chartRanges[range].spoken}:{' '}
                    {history.data.mode === 'buckets'
                      ? `${formatCount(history.data.total)} readings, summarised as the mean and range of each period.`
                      : `${formatCount(history.data.total)} readings.`}{' '}
                    Points mark {readingSourceLabels['home-test'].toLowerCase()}s (triangles) and{' '}
                    {readingSourceLabels.visit.toLowerCase()}s (diamonds).{' '}
                    {unit === 'specific gravity' &&
                      'Specific gravity is shown as read at 25 °C on an instrument referenced to 25 °C (EOS-80 density, UNESCO Technical Paper 44). '}
                    {history.data.limits.limits ? (
                      <span data-testid="chart-bands">
                        Shaded bands: {limitsSummary(parameter, history.data.limits.limits, unit)}
                        {history.data.limits.source === 'template'
                          ? ' (the usual starting limits for this style of tank)'
                          : ''}
                        .
                      </span>
                    ) : (
                      'This tank has no limits for it.'
                    )}
                    {tolerated && (
                      <span data-testid="chart-livestock">
                        {' '}
                        Dotted lines: what the livestock tolerate together,{' '}
                        {rangeSummary(parameter, tolerated, unit)}
                        {tolerated.species.length > 0 && <> (set by the {joinWithAnd(tolerated.species)})</>}.
                      </span>
                    )}
                  </figcaption>
                </figure>
                <div aria-label={`${label} over the ${chartRanges[range].spoken}`} role="group">
                  <WindowStats history={history.data} parameter={parameter} unit={unit} />
                </div>
              </div>
            )}
          </div>
        </>
      )}
    </section>
  );
}

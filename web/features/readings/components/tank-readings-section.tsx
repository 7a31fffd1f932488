import { useState } from 'react';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { can, useMe } from '../../../lib/auth';
import { useLimits } from '../api/get-limits';
import { useLatestReadings } from '../../../lib/queries/latest-readings';
import { preferredUnit, rememberUnit } from '../utils/display-units';
import { relativeTime } from '../../../lib/format';
import { DevicesPanel } from './devices-panel';
import { LatestReadings } from './latest-readings';
import { LimitsEditor } from './limits-editor';
import { ReadingEntryForm } from './reading-entry-form';
import { ReadingsChartPanel } from './readings-chart-panel';
import { StatusReason, TankStatusBadge } from '../../../components/status-badges';

/** The order parameters are usually talked about in, most watched first. */
const byCatalogue = (a: ParameterKey, b: ParameterKey) => parameterKeys.indexOf(a) - parameterKeys.indexOf(b);

/**
 * Everything about a tank's water on its page: the latest reading of each parameter judged
 * against its limits, the history chart and table, entering readings, and — for staff — the
 * limits and the devices. `canEdit` is true for the company's staff.
 */
export function TankReadingsSection({
  tankId,
  canEdit,
  initialParameter,
}: {
  tankId: string;
  canEdit: boolean;
  /** The parameter to chart first, e.g. the one tapped in the tank's key readings. */
  initialParameter?: ParameterKey;
}) {
  const me = useMe();
  // Staff tools only for those allowed them, whatever the page passes: the API would refuse anyone else.
  const setsLimits = canEdit && can(me.data, 'limits:write');
  const managesDevices = canEdit && can(me.data, 'devices:manage');
  // Visit readings come from the company's staff, who are the ones who service (write) the tank.
  const recordsVisits = canEdit && can(me.data, 'readings:record-visit');
  const latest = useLatestReadings(tankId);
  const limits = useLimits(tankId);
  const [selected, setSelected] = useState<ParameterKey | null>(initialParameter ?? null);
  const [units, setUnits] = useState<Partial<Record<ParameterKey, string>>>({});

  if (latest.isPending) return <LoadingState label="Loading the water readings…" />;
  if (latest.isError) {
    return (
      <ErrorState error={latest.error} what="this tank's readings" onRetry={() => void latest.refetch()} />
    );
  }

  const health = latest.data;
  const forWater = limits.data?.parameters.map((p) => p.parameter) ?? [];
  const shown = health.parameters.map((p) => p.parameter);
  const chartable = [...new Set([...shown, ...forWater])].sort(byCatalogue);
  const withReadings = health.parameters.filter((p) => p.latest);
  const parameter =
    selected ??
    withReadings.find((p) => p.parameter === 'temperature')?.parameter ??
    withReadings[0]?.parameter ??
    chartable[0] ??
    'temperature';
  const unitOf = (key: ParameterKey) => units[key] ?? preferredUnit(key);
  const chooseUnit = (key: ParameterKey, unit: string) => {
    rememberUnit(key, unit);
    setUnits((current) => ({ ...current, [key]: unit }));
  };
  const fromDevice = new Set(
    health.parameters.filter((p) => p.latest?.source === 'device').map((p) => p.parameter),
  );
  // Every watched parameter a person can test is offered, including those a device reports too: a
  // hand-meter check of the probe is a normal visit task. ORP and the like (no hand test) are not.
  const handTestable = (key: ParameterKey) => parameterCatalogue[key].homeTestIntervalMs !== null;
  const suggested = (
    shown.length > 0 ? health.parameters.filter((p) => p.watched).map((p) => p.parameter) : forWater
  ).filter(handTestable);

  return (
    <section aria-labelledby="readings-title" className="space-y-5">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <h2 id="readings-title" className="text-2xl font-bold text-ink-900">
          Water readings
        </h2>
        <TankStatusBadge status={health.status} size="lg" />
        <StatusReason reason={health.statusReason} className="basis-full" />
        {health.lastReadingAt && (
          <p className="text-sm text-ink-700">Last reading {relativeTime(health.lastReadingAt)}</p>
        )}
      </div>

      {health.parameters.length === 0 ? (
        <EmptyState title="No readings yet">
          Readings from visits, home tests and devices appear here, judged against the tank&apos;s limits.
        </EmptyState>
      ) : (
        <LatestReadings
          parameters={health.parameters}
          units={Object.fromEntries(health.parameters.map((p) => [p.parameter, unitOf(p.parameter)]))}
          selected={parameter}
          onSelect={setSelected}
        />
      )}

      {chartable.length > 0 && (
        <ReadingsChartPanel
          tankId={tankId}
          parameters={chartable}
          parameter={parameter}
          onParameterChange={setSelected}
          unit={unitOf(parameter)}
          onUnitChange={(unit) => chooseUnit(parameter, unit)}
          canImport
          defaultImportSource={recordsVisits ? 'visit' : 'home-test'}
        />
      )}

      <ReadingEntryForm
        key={`${recordsVisits}:${suggested.join(',')}:${[...fromDevice].join(',')}`}
        tankId={tankId}
        canRecordVisits={recordsVisits}
        suggested={suggested.length > 0 ? suggested : ['temperature', 'ph']}
        available={chartable.length > 0 ? chartable : [...parameterKeys]}
        deviceReported={[...fromDevice]}
      />

      {(setsLimits || managesDevices) && (
        <div className="grid items-start gap-5 xl:grid-cols-[3fr_2fr]">
          {setsLimits && <LimitsEditor tankId={tankId} />}
          {managesDevices && <DevicesPanel tankId={tankId} />}
        </div>
      )}
    </section>
  );
}

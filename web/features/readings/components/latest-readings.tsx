import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import type { ParameterHealthSummary } from '@shared/schemas/readings';
import { readingSourceLabels } from '@shared/readings/source-labels';
import { formatIn } from '../utils/display-units';
import { formatDateTime, relativeTime } from '../../../lib/format';
import { limitsSummary } from '../utils/limits-text';
import { ParameterHealthBadge } from '../../../components/status-badges';

interface LatestReadingsProps {
  parameters: ParameterHealthSummary[];
  units: Partial<Record<ParameterKey, string>>;
  selected: ParameterKey | null;
  onSelect: (parameter: ParameterKey) => void;
  /** What pressing a tile does, for screen readers; by default it shows that parameter in the chart. */
  action?: string;
}

/** One tile per parameter: its latest reading, how it stands against the limits, and a way to its chart. */
export function LatestReadings({ parameters, units, selected, onSelect, action }: LatestReadingsProps) {
  return (
    <ul className="grid grid-cols-2 gap-3 lg:grid-cols-4">
      {parameters.map((p) => {
        const unit = units[p.parameter] ?? parameterCatalogue[p.parameter].unit;
        const isSelected = selected === p.parameter;
        return (
          <li key={p.parameter}>
            <button
              type="button"
              onClick={() => onSelect(p.parameter)}
              aria-pressed={action ? undefined : isSelected}
              className={`flex h-full min-h-28 w-full flex-col gap-1.5 rounded-card border-2 bg-white p-3 sm:p-4 text-left shadow-card transition-colors hover:border-ink-500 ${
                isSelected ? 'border-ink-800' : 'border-transparent'
              }`}
            >
              <span className="flex w-full flex-wrap items-start justify-between gap-x-2 gap-y-1">
                <span className="font-bold text-ink-900">{parameterCatalogue[p.parameter].label}</span>
                <ParameterHealthBadge health={p.health} />
              </span>
              <span className="text-xl font-bold text-ink-950 sm:text-2xl">
                {p.latest ? formatIn(p.parameter, p.latest.value, unit) : '—'}
              </span>
              <span className="text-sm text-ink-700">
                {p.latest ? (
                  <>
                    <time dateTime={p.latest.measuredAt} title={formatDateTime(p.latest.measuredAt)}>
                      {relativeTime(p.latest.measuredAt)}
                    </time>{' '}
                    · {readingSourceLabels[p.latest.source]}
                  </>
                ) : (
                  'No reading yet'
                )}
              </span>
              <span className="hidden text-xs text-ink-600 sm:block">
                {p.watched && p.limits
                  ? limitsSummary(p.parameter, p.limits, unit)
                  : 'No limits: not watched'}
              </span>
              <span className="sr-only">
                {action ?? (isSelected ? 'Shown in the chart' : 'Show in the chart')}
              </span>
            </button>
          </li>
        );
      })}
    </ul>
  );
}

import type { ParameterHealth } from '@shared/parameters/health';
import { StatusShape, toneClasses, type StatusTone } from './status-shapes';

export const parameterHealthWords: Record<ParameterHealth, { label: string; tone: StatusTone }> = {
  'in-range': { label: 'In range', tone: 'good' },
  warning: { label: 'Warning', tone: 'watch' },
  critical: { label: 'Critical', tone: 'alert' },
  stale: { label: 'Not current', tone: 'none' },
};

export function ParameterHealthBadge({ health }: { health: ParameterHealth }) {
  const { label, tone } = parameterHealthWords[health];
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-bold ${toneClasses[tone]}`}
    >
      <StatusShape tone={tone} className="h-3.5 w-3.5" />
      {label}
    </span>
  );
}

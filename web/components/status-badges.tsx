import type { ParameterHealth, TankStatus } from '@shared/parameters/health';
import { Badge } from './badge';

/*
 * Brinewatch's status shapes, drawn so a status reads without colour: a ticked circle (all well),
 * a diamond with a dot (look at it soon), a triangle with a bar (act now), a broken ring (nothing
 * current to judge by). Each badge pairs its shape with a word.
 */
export type StatusTone = 'good' | 'watch' | 'alert' | 'none';

export function StatusShape({ tone, className = 'h-4 w-4' }: { tone: StatusTone; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" className={`shrink-0 ${className}`} aria-hidden="true" focusable="false">
      {tone === 'good' && (
        <>
          <circle cx="8" cy="8" r="7" fill="currentColor" />
          <path
            d="M4.6 8.3 7 10.6l4.5-5"
            fill="none"
            stroke="#fff"
            strokeWidth="1.9"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </>
      )}
      {tone === 'watch' && (
        <>
          <path d="M8 0.8 15.2 8 8 15.2 0.8 8z" fill="currentColor" />
          <circle cx="8" cy="8" r="2" fill="#fff" />
        </>
      )}
      {tone === 'alert' && (
        <>
          <path d="M8 1.2 15.3 14.4H0.7z" fill="currentColor" strokeLinejoin="round" />
          <rect x="7.05" y="5.4" width="1.9" height="5" rx="0.9" fill="#fff" />
          <circle cx="8" cy="12.2" r="1" fill="#fff" />
        </>
      )}
      {tone === 'none' && (
        <circle
          cx="8"
          cy="8"
          r="6"
          fill="none"
          stroke="currentColor"
          strokeWidth="2"
          strokeDasharray="3.2 2.4"
        />
      )}
    </svg>
  );
}

export const statusToneClasses: Record<StatusTone, string> = {
  good: 'border bg-healthy-100 text-healthy-700 border-healthy-700/30',
  watch: 'border bg-watch-100 text-watch-700 border-watch-700/30',
  alert: 'border bg-alert-100 text-alert-700 border-alert-700/30',
  none: 'border bg-nodata-100 text-nodata-700 border-nodata-700/30',
};

export const tankStatusWords: Record<TankStatus, { label: string; tone: StatusTone }> = {
  healthy: { label: 'Healthy', tone: 'good' },
  watch: { label: 'Watch', tone: 'watch' },
  alert: { label: 'Alert', tone: 'alert' },
  'no-data': { label: 'No recent data', tone: 'none' },
};

/** A tank's status at a glance: shape, word and colour together, never colour alone. */
export function TankStatusBadge({ status, size = 'md' }: { status: TankStatus; size?: 'md' | 'lg' }) {
  const { label, tone } = tankStatusWords[status];
  return (
    <Badge
      tone={statusToneClasses[tone]}
      size={size}
      mark={<StatusShape tone={tone} className={size === 'lg' ? 'h-5 w-5' : 'h-4 w-4'} />}
    >
      {label}
    </Badge>
  );
}

export const parameterHealthWords: Record<ParameterHealth, { label: string; tone: StatusTone }> = {
  'in-range': { label: 'In range', tone: 'good' },
  warning: { label: 'Warning', tone: 'watch' },
  critical: { label: 'Critical', tone: 'alert' },
  stale: { label: 'Not current', tone: 'none' },
};

export function ParameterHealthBadge({ health }: { health: ParameterHealth }) {
  const { label, tone } = parameterHealthWords[health];
  return (
    <Badge
      tone={statusToneClasses[tone]}
      size="sm"
      mark={<StatusShape tone={tone} className="h-3.5 w-3.5" />}
    >
      {label}
    </Badge>
  );
}

/** The status in words, beside its badge, so "Watch" always comes with why. */
export function StatusReason({ reason, className = '' }: { reason: string; className?: string }) {
  return <p className={`text-sm text-ink-700 ${className}`}>{reason}</p>;
}

import { auditActionLabels } from '@shared/audit/actions';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKey } from '@shared/parameters/keys';
import type { AuditEntry } from '@shared/schemas/audit';
import { capitalise, formatDateTime, formatNumber } from '../../../lib/format';

/*
 * Plain words for what an entry changed. Settings are kept as JSON; the few shapes the trail
 * holds (a role, an account status, a tank's limits and rate rule) are written out in full.
 */

const fieldNames: Record<string, string> = {
  role: 'Role',
  status: 'Account',
  reason: 'Reason',
  tank: 'Tank',
  tokenHint: 'Token starts',
  filters: 'Filters',
  parameter: 'Parameter',
  source: 'Source',
  from: 'From',
  to: 'To',
  uploadedAt: 'Uploaded',
};

function fieldName(key: string): string {
  const parameter = parameterKey.safeParse(key);
  if (parameter.success) return parameterCatalogue[parameter.data].label;
  return fieldNames[key] ?? capitalise(key);
}

const isInstant = (text: string) =>
  /^\d{4}-\d\d-\d\dT\d\d:\d\d/.test(text) && !Number.isNaN(Date.parse(text));

const bound = (value: unknown) => (typeof value === 'number' ? formatNumber(value, 3) : '—');

interface Limits {
  warnLow: unknown;
  warnHigh: unknown;
  critLow: unknown;
  critHigh: unknown;
  rate?: { maxChange: number; perHours: number } | null;
}

const isLimits = (value: object): value is Limits => 'warnLow' in value && 'critHigh' in value;

function limitsText(limits: Limits): string {
  const parts = [
    `warning ${bound(limits.warnLow)} to ${bound(limits.warnHigh)}`,
    `critical ${bound(limits.critLow)} to ${bound(limits.critHigh)}`,
  ];
  if (limits.rate) {
    parts.push(`alert on a change over ${bound(limits.rate.maxChange)} in ${bound(limits.rate.perHours)} h`);
  }
  return parts.join('; ');
}

/** One value as a person reads it; `none` is what an empty value means for this entry. */
export function valueText(value: unknown, none: string): string {
  if (value === null || value === undefined) return none;
  if (typeof value === 'number') return formatNumber(value, 3);
  if (typeof value === 'string') return isInstant(value) ? formatDateTime(value) : value;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (Array.isArray(value)) return value.map((v) => valueText(v, none)).join(', ');
  if (typeof value === 'object') {
    if (isLimits(value)) return limitsText(value);
    const entries = Object.entries(value as Record<string, unknown>);
    if (entries.length === 0) return none;
    return entries.map(([key, v]) => `${fieldName(key).toLowerCase()} ${valueText(v, none)}`).join(', ');
  }
  return String(value);
}

/** Settings before and after, one line per setting that the entry holds. */
export function AuditChanges({ entry }: { entry: AuditEntry }) {
  const { before, after } = entry;
  if (!before && !after) return null;
  const keys = [...new Set([...Object.keys(before ?? {}), ...Object.keys(after ?? {})])];
  // A tank's limits with no row of its own follow its style's template.
  const none = entry.action === 'limits.changed' ? "the style's template" : 'not set';
  return (
    <dl className="mt-1 space-y-1 text-sm" aria-label={`Changes: ${auditActionLabels[entry.action]}`}>
      {keys.map((key) => (
        <div key={key}>
          <dt className="font-bold text-ink-900">{fieldName(key)}</dt>
          <dd className="text-ink-800">
            <span>was {valueText(before?.[key], none)}</span>
            <span aria-hidden="true"> → </span>
            <span className="sr-only">, </span>
            <span className="font-bold">now {valueText(after?.[key], none)}</span>
          </dd>
        </div>
      ))}
    </dl>
  );
}

/** Other facts of the entry: a refusal's reason, an export's filters, an invitation's role. */
export function AuditDetails({ entry }: { entry: AuditEntry }) {
  if (!entry.details) return null;
  const entries = Object.entries(entry.details);
  if (entries.length === 0) return null;
  return (
    <p className="mt-1 text-sm text-ink-700">
      {entries.map(([key, value]) => `${fieldName(key)}: ${valueText(value, 'none')}`).join(' · ')}
    </p>
  );
}

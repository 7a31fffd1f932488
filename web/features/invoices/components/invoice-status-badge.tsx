import type { InvoiceKind, InvoiceStatus } from '@shared/billing/invoices';
import type { ReactNode } from 'react';
import { Badge } from '../../../components/badge';
import { StatusShape, statusToneClasses } from '../../../components/status-badges';
import { statusLabel } from '../utils/invoice-text';

/*
 * Each state has its own shape beside its word, never colour alone: a dashed square for a draft
 * (not finished), a clock for an invoice waiting to be paid, the warning triangle when it is overdue,
 * the ticked circle once paid (or a credit note issued) and a struck-through circle when cancelled.
 */

function DraftShape() {
  return (
    <svg viewBox="0 0 16 16" className="h-4 w-4" focusable="false">
      <rect
        x="2"
        y="2"
        width="12"
        height="12"
        rx="2"
        fill="none"
        stroke="currentColor"
        strokeWidth="2"
        strokeDasharray="3 2.2"
      />
    </svg>
  );
}

function WaitingShape() {
  return (
    <svg viewBox="0 0 16 16" className="h-4 w-4" focusable="false">
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M8 4.5V8l2.5 1.5" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
    </svg>
  );
}

function CancelledShape() {
  return (
    <svg viewBox="0 0 16 16" className="h-4 w-4" focusable="false">
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M3.5 12.5 12.5 3.5" stroke="currentColor" strokeWidth="2" />
    </svg>
  );
}

const looks: Readonly<Record<InvoiceStatus, { tone: string; mark: ReactNode }>> = {
  draft: { tone: 'border border-ink-300 bg-ink-50 text-ink-900', mark: <DraftShape /> },
  issued: { tone: 'border border-brine-700/30 bg-brine-100 text-brine-700', mark: <WaitingShape /> },
  overdue: { tone: statusToneClasses.alert, mark: <StatusShape tone="alert" /> },
  paid: { tone: statusToneClasses.good, mark: <StatusShape tone="good" /> },
  void: { tone: statusToneClasses.none, mark: <CancelledShape /> },
};

export function InvoiceStatusBadge({
  kind,
  status,
  size = 'md',
}: {
  kind: InvoiceKind;
  status: InvoiceStatus;
  size?: 'sm' | 'md' | 'lg';
}) {
  const look = kind === 'credit-note' && status !== 'draft' && status !== 'void' ? looks.paid : looks[status];
  return (
    <Badge tone={look.tone} size={size} mark={look.mark}>
      {statusLabel(kind, status)}
    </Badge>
  );
}

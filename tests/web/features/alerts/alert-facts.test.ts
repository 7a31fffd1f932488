import { describe, expect, it } from 'vitest';
import type { AlertView } from '@shared/schemas/alerts';
import { readingFacts } from '../../../../web/features/alerts/utils/alert-facts';

const alert = (over: Partial<AlertView>): AlertView => ({
  id: '00000000-0000-4000-8000-000000000001',
  tank: { id: '00000000-0000-4000-8000-000000000002', name: 'Lobby reef', siteLabel: null },
  kind: 'limit',
  parameter: 'salinity',
  severity: 'warning',
  status: 'open',
  title: 'Salinity high',
  body: '',
  value: 36.01,
  limitValue: 36,
  direction: 'high',
  openedAt: '2026-12-01T17:40:00.000Z',
  lastSeenAt: '2026-12-01T17:40:00.000Z',
  acknowledgedAt: null,
  acknowledgedBy: null,
  resolvedAt: null,
  ...over,
});

describe('readingFacts', () => {
  it('never shows a reading beyond its limit as the same figure as the limit', () => {
    expect(readingFacts(alert({}))).toEqual({ label: 'Salinity', reading: '36.01 ppt', limit: '36.00 ppt' });
  });

  it('keeps the usual precision when the figures already differ', () => {
    expect(readingFacts(alert({ value: 36.4 }))).toEqual({
      label: 'Salinity',
      reading: '36.4 ppt',
      limit: '36 ppt',
    });
  });

  it('gives no limit for a rate alert, whose limit is a change per period', () => {
    expect(readingFacts(alert({ kind: 'rate', value: 36.4, limitValue: 1 }))?.limit).toBeNull();
  });
});

import { describe, expect, it } from 'vitest';
import { reportSummary } from '@shared/schemas/visit-summary';
import { emptyReport, type VisitReportContent } from '@shared/schemas/visits';

describe('reportSummary', () => {
  it('is one sentence: a capital only at its start', () => {
    const report: VisitReportContent = {
      ...emptyReport,
      waterChange: { percent: 15, litres: 57 },
      tasksDone: ['water-change', 'livestock'],
    };
    expect(reportSummary(report)).toBe('Water change 15 % (57 L); added, moved or removed livestock.');
  });

  it('says nothing of an empty report', () => {
    expect(reportSummary(emptyReport)).toBe('');
  });
});

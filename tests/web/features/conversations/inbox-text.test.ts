import { describe, expect, it } from 'vitest';
import { previewLine, waitingLabel } from '../../../../web/features/conversations/utils/inbox-text';

describe('waitingLabel', () => {
  const now = Date.parse('2026-12-01T12:00:00.000Z');
  const ago = (ms: number) => new Date(now - ms).toISOString();

  it('says how long an owner has waited, in the largest unit that reads naturally', () => {
    expect(waitingLabel(ago(20_000), now)).toBe('Waiting less than a minute');
    expect(waitingLabel(ago(25 * 60_000), now)).toBe('Waiting 25 min');
    expect(waitingLabel(ago(3 * 3_600_000), now)).toBe('Waiting 3 h');
    expect(waitingLabel(ago(3 * 3_600_000 + 5 * 60_000), now)).toBe('Waiting 3 h 5 min');
    expect(waitingLabel(ago(26 * 3_600_000), now)).toBe('Waiting 1 day');
    expect(waitingLabel(ago(50 * 3_600_000), now)).toBe('Waiting 2 days');
  });
});

describe('previewLine', () => {
  const last = { authorName: 'Mara', at: '2026-12-01T12:00:00.000Z' };

  it('prefixes an internal note so it is never read as a message to the owner', () => {
    expect(previewLine({ ...last, kind: 'internal-note', body: 'Call before the visit' })).toBe(
      'Note: Call before the visit',
    );
    expect(previewLine({ ...last, kind: 'message', body: 'The heater\nlight is off' })).toBe(
      'The heater light is off',
    );
  });

  it('cuts a long line at a word, and says when there is nothing yet', () => {
    const long = `${'salinity '.repeat(30)}end`;
    const preview = previewLine({ ...last, kind: 'message', body: long });

    expect(preview.endsWith('salinity…')).toBe(true);
    expect(preview.length).toBeLessThanOrEqual(141);
    expect(previewLine(null)).toBe('No messages yet');
  });
});

import { describe, expect, it } from 'vitest';
import { evaluateStaleDevice } from '@shared/alerts/stale-device';
import { deviceStaleAfterMs } from '@shared/parameters/catalogue';
import { createTestClock, days, minutes } from '../../helpers/clock';
import { seriesStart } from './reading-series';

/** A device added a day before its last reading. */
const reportedAt = (lastSeenAt: Date) => ({
  lastSeenAt,
  createdAt: new Date(lastSeenAt.getTime() - days(1)),
});

describe('evaluateStaleDevice', () => {
  it('treats a device as silent after 30 minutes without a reading', () => {
    const clock = createTestClock(new Date(seriesStart));
    const lastSeen = clock.now();

    clock.advance(minutes(30));
    const onTime = evaluateStaleDevice(reportedAt(lastSeen), clock.now());
    clock.advance(1);
    const late = evaluateStaleDevice(reportedAt(lastSeen), clock.now());

    expect(deviceStaleAfterMs).toBe(minutes(30));
    expect(onTime.stale).toBe(false);
    expect(late.stale).toBe(true);
  });

  it('reports how long the device has been silent', () => {
    const clock = createTestClock(new Date(seriesStart));
    const lastSeen = clock.now();
    clock.advance(minutes(45));

    expect(evaluateStaleDevice(reportedAt(lastSeen), clock.now())).toEqual({
      stale: true,
      silentForMs: minutes(45),
      staleAfterMs: minutes(30),
    });
  });

  it('accepts a tank-specific interval', () => {
    const clock = createTestClock(new Date(seriesStart));
    const lastSeen = clock.now();
    clock.advance(minutes(45));

    expect(evaluateStaleDevice(reportedAt(lastSeen), clock.now(), minutes(60)).stale).toBe(false);
  });

  it('measures a device that has never reported from when it was added', () => {
    const clock = createTestClock(new Date(seriesStart));
    const device = { lastSeenAt: null, createdAt: clock.now() };

    clock.advance(minutes(30));
    const justAdded = evaluateStaleDevice(device, clock.now());
    clock.advance(minutes(15));
    const neverConnected = evaluateStaleDevice(device, clock.now());

    expect(justAdded.stale).toBe(false);
    expect(neverConnected).toEqual({ stale: true, silentForMs: minutes(45), staleAfterMs: minutes(30) });
  });
});

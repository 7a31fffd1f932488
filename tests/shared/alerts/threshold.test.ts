import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateThreshold, initialThresholdState, thresholdState } from '@shared/alerts/threshold';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { minutes } from '../../helpers/clock';
import { count, limits, runThreshold, series } from './reading-series';

// Temperature limits in °C, with the catalogue's 0.2 °C deadband.
const temperature = limits({ warnLow: 24, warnHigh: 27, critLow: 22, critHigh: 28.5 });
const deadband = parameterCatalogue.temperature.deadband;
const dwell = { readings: 3, minutes: 15 };

describe('evaluateThreshold', () => {
  it('opens a warning alert as soon as a home test reads above the warning limit', () => {
    const [reading] = series([27.3], { source: 'home-test' });

    const result = evaluateThreshold(initialThresholdState, reading!, temperature, { deadband });

    expect(result).toMatchObject({ action: 'open', severity: 'warning', direction: 'high', limit: 27 });
    expect(result.state.open?.openedAt).toEqual(reading!.measuredAt);
  });

  it('does nothing for a reading exactly on a limit, and a reading on the critical limit is only a warning', () => {
    const { actions } = runThreshold(series([27, 24], { source: 'visit' }), temperature, { deadband });
    const [onCritical] = series([28.5], { source: 'visit' });

    expect(actions).toEqual(['none', 'none']);
    expect(evaluateThreshold(initialThresholdState, onCritical!, temperature, { deadband })).toMatchObject({
      action: 'open',
      severity: 'warning',
    });
  });

  it('opens at most one alert for 100 readings alternating ±0.05 °C around the warning limit', () => {
    const values = Array.from({ length: 100 }, (_, i) => 27 + (i % 2 === 0 ? 0.05 : -0.05));

    for (const source of ['device', 'home-test'] as const) {
      const { actions } = runThreshold(series(values, { source }), temperature, { deadband, dwell });

      expect(count(actions, 'open')).toBe(1);
      expect(count(actions, 'resolve')).toBe(0);
    }
  });

  it('opens at most one alert for any 100-point series within ±0.05 of a limit, whatever the source and dwell', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -0.05, max: 0.05, noNaN: true }), { minLength: 100, maxLength: 100 }),
        fc.constantFrom('device', 'home-test', 'visit'),
        fc.constantFrom(27, 24, 28.5, 22),
        fc.option(
          fc.record({ readings: fc.integer({ min: 1, max: 6 }), minutes: fc.integer({ min: 0, max: 60 }) }),
          {
            nil: undefined,
          },
        ),
        (noise, source, limit, chosenDwell) => {
          const readings = series(
            noise.map((n) => limit + n),
            { source },
          );
          const { actions } = runThreshold(readings, temperature, { deadband, dwell: chosenDwell });

          expect(count(actions, 'open')).toBeLessThanOrEqual(1);
          expect(count(actions, 'resolve')).toBe(0);
          expect(count(actions, 'escalate') + count(actions, 'de-escalate')).toBeLessThanOrEqual(1);
        },
      ),
    );
  });

  it('never opens a second alert while one is open, unless it replaces it from the other side', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 20, max: 30, noNaN: true }), { minLength: 1, maxLength: 200 }),
        fc.constantFrom('device', 'home-test'),
        (values, source) => {
          const { outcomes } = runThreshold(series(values, { source }), temperature, { deadband, dwell });
          let open = false;
          for (const outcome of outcomes) {
            if (outcome.action === 'open') expect(open).toBe(outcome.replacesOpenAlert);
            if (
              outcome.action === 'resolve' ||
              outcome.action === 'escalate' ||
              outcome.action === 'de-escalate'
            ) {
              expect(open).toBe(true);
            }
            open = outcome.state.open !== null;
          }
        },
      ),
    );
  });

  describe('hysteresis', () => {
    it('keeps the alert open while the reading is back inside the limit by less than the deadband', () => {
      const { actions, last } = runThreshold(
        series([27.4, 26.9, 26.85], { source: 'home-test' }),
        temperature,
        {
          deadband,
        },
      );

      expect(actions).toEqual(['open', 'none', 'none']);
      expect(last?.state.open).not.toBeNull();
    });

    it('resolves once the reading is back inside by more than the deadband', () => {
      const { actions, last } = runThreshold(
        series([27.4, 26.9, 26.7], { source: 'home-test' }),
        temperature,
        {
          deadband,
        },
      );

      expect(actions).toEqual(['open', 'none', 'resolve']);
      expect(last).toMatchObject({ severity: 'warning', direction: 'high', limit: 27 });
      expect(last?.state.open).toBeNull();
    });

    it('opens a new alert after a resolve only when the reading crosses the limit again', () => {
      const { actions } = runThreshold(
        series([27.4, 26.7, 26.95, 27.1], { source: 'home-test' }),
        temperature,
        { deadband },
      );

      expect(actions).toEqual(['open', 'resolve', 'none', 'open']);
    });

    it('works the same way on the low side', () => {
      const { actions } = runThreshold(series([23.8, 24.1, 24.3], { source: 'visit' }), temperature, {
        deadband,
      });

      expect(actions).toEqual(['open', 'none', 'resolve']);
    });
  });

  describe('dwell for device readings', () => {
    it('does not open for a single device spike', () => {
      const { actions } = runThreshold(series([26.5, 27.6, 26.5, 26.5]), temperature, { deadband, dwell });

      expect(count(actions, 'open')).toBe(0);
    });

    it('opens on the third consecutive device reading beyond the limit', () => {
      const { actions } = runThreshold(
        series([27.2, 27.3, 27.4, 27.5], { everyMs: minutes(1) }),
        temperature,
        {
          deadband,
          dwell,
        },
      );

      expect(actions).toEqual(['none', 'none', 'open', 'none']);
    });

    it('opens once the breach has lasted the dwell minutes, however few readings arrived', () => {
      const { actions } = runThreshold(series([27.2, 27.3], { everyMs: minutes(15) }), temperature, {
        deadband,
        dwell,
      });

      expect(actions).toEqual(['none', 'open']);
    });

    it('starts the dwell again after a device reading well back inside the limit', () => {
      const { actions } = runThreshold(series([27.2, 27.3, 26.5, 27.2, 27.3]), temperature, {
        deadband,
        dwell,
      });

      expect(count(actions, 'open')).toBe(0);
    });

    it('counts readings just inside the limit towards the dwell, but opens only on one beyond it', () => {
      const { actions, last } = runThreshold(series([27.1, 26.95, 26.9, 27.05]), temperature, {
        deadband,
        dwell,
      });

      expect(actions).toEqual(['none', 'none', 'none', 'open']);
      expect(last?.state.open?.severity).toBe('warning');
    });

    it('acts on a manual reading at once even when a dwell is set', () => {
      const { actions } = runThreshold(series([27.2], { source: 'visit' }), temperature, { deadband, dwell });

      expect(actions).toEqual(['open']);
    });

    it('acts on device readings at once when no dwell is set', () => {
      const { actions } = runThreshold(series([27.2]), temperature, { deadband });

      expect(actions).toEqual(['open']);
    });
  });

  describe('severity', () => {
    it('escalates the same alert from warning to critical', () => {
      const { outcomes } = runThreshold(series([27.5, 28.7], { source: 'home-test' }), temperature, {
        deadband,
      });
      const [opened, escalated] = outcomes;

      expect(escalated).toMatchObject({
        action: 'escalate',
        severity: 'critical',
        direction: 'high',
        limit: 28.5,
      });
      expect(escalated?.state.open?.openedAt).toEqual(opened?.state.open?.openedAt);
    });

    it('opens straight at critical when the first reading is beyond the critical limit', () => {
      const { outcomes } = runThreshold(series([21.5], { source: 'visit' }), temperature, { deadband });

      expect(outcomes[0]).toMatchObject({
        action: 'open',
        severity: 'critical',
        direction: 'low',
        limit: 22,
      });
    });

    it('de-escalates to warning, keeping the alert open, once back inside the critical limit by the deadband', () => {
      const { actions, last } = runThreshold(
        series([28.7, 28.4, 28.2], { source: 'home-test' }),
        temperature,
        { deadband },
      );

      expect(actions).toEqual(['open', 'none', 'de-escalate']);
      expect(last).toMatchObject({ severity: 'warning', limit: 27 });
      expect(last?.state.open).not.toBeNull();
    });

    it('resolves straight from critical when the reading drops back well within limits', () => {
      const { actions, last } = runThreshold(series([28.7, 26], { source: 'home-test' }), temperature, {
        deadband,
      });

      expect(actions).toEqual(['open', 'resolve']);
      expect(last?.severity).toBe('critical');
    });

    it('waits for the dwell before escalating on device readings', () => {
      const { actions } = runThreshold(
        series([27.5, 27.5, 27.5, 28.7, 28.8, 28.9], { everyMs: minutes(1) }),
        temperature,
        {
          deadband,
          dwell,
        },
      );

      expect(actions).toEqual(['none', 'none', 'open', 'none', 'none', 'escalate']);
    });

    it('goes straight to critical on a side that has only a critical limit', () => {
      const phosphate = limits({ warnHigh: null, critHigh: 0.25 });
      const { outcomes } = runThreshold(series([0.3, 0.245, 0.2], { source: 'home-test' }), phosphate, {
        deadband: 0.01,
      });

      expect(outcomes.map((o) => [o.action, o.severity])).toEqual([
        ['open', 'critical'],
        ['none', 'critical'],
        ['resolve', 'critical'],
      ]);
    });
  });

  it('replaces a high alert with a low one when a reading lands beyond the other side', () => {
    const { outcomes } = runThreshold(series([27.5, 23.5], { source: 'home-test' }), temperature, {
      deadband,
    });

    expect(outcomes[1]).toMatchObject({
      action: 'open',
      replacesOpenAlert: true,
      severity: 'warning',
      direction: 'low',
      limit: 24,
    });
  });

  it('changes nothing for a reading not newer than the last one, so a replayed batch is harmless', () => {
    const readings = series([27.5, 26, 26]);
    const { last } = runThreshold(readings, temperature, { deadband });

    const replay = evaluateThreshold(last!.state, readings[0]!, temperature, { deadband });

    expect(replay.action).toBe('none');
    expect(replay.state).toBe(last!.state);
  });

  it('resolves an open alert when the limits are removed', () => {
    const { last } = runThreshold(series([27.5], { source: 'home-test' }), temperature, { deadband });
    const [later] = series([27.5], { source: 'home-test', start: '2026-12-02T08:00:00Z' });

    expect(evaluateThreshold(last!.state, later!, null, { deadband }).action).toBe('resolve');
  });

  it('keeps only what it needs in its state', () => {
    const { last } = runThreshold(series([27.5], { source: 'visit' }), temperature, { deadband });

    expect(Object.keys(last!.state.open!).sort()).toEqual(['direction', 'openedAt', 'severity']);
  });

  it('keeps its state through a JSON round trip, so the API can store it', () => {
    const { last } = runThreshold(series([27.5, 27.6, 27.7, 28.9]), temperature, { deadband, dwell });

    const restored = thresholdState.parse(JSON.parse(JSON.stringify(last!.state)));

    expect(restored).toEqual(last!.state);
  });
});

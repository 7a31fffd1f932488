import { describe, expect, it } from 'vitest';
import type { LivestockInhabitant } from '@shared/alerts/livestock';
import { deviceStaleAfter, reportingGaps } from '@shared/alerts/stale-device';
import type { LatestReading } from '@shared/parameters/health';
import type { ParameterLimits } from '@shared/parameters/limits';
import { judgeTank, type OpenAlertFact, type ParameterFacts } from '@shared/tanks/status';
import { days, hours, minutes } from '../../helpers/clock';

const now = new Date('2026-12-01T12:00:00.000Z');
const ago = (ms: number) => new Date(now.getTime() - ms);

const phLimits: ParameterLimits = { warnLow: 6.5, warnHigh: 7.8, critLow: 6, critHigh: 8.2 };
const temperatureLimits: ParameterLimits = { warnLow: 24, warnHigh: 27, critLow: 22, critHigh: 28.5 };

const homeTest = (value: number, at: Date): LatestReading => ({ value, measuredAt: at, source: 'home-test' });
const device = (value: number, at: Date): LatestReading => ({ value, measuredAt: at, source: 'device' });

/** Report times every `everyMs` up to `last`, as a device's recent history. */
const reportsEvery = (everyMs: number, last: Date, count = 11) =>
  reportingGaps(Array.from({ length: count }, (_, i) => new Date(last.getTime() - i * everyMs)));

function fish(speciesId: string, commonName: string, ph: { min: number; max: number }): LivestockInhabitant {
  return { speciesId, commonName, scientificName: 'Testus exemplaris', ranges: { ph } };
}
const cardinal: LivestockInhabitant = {
  speciesId: 'cardinal-tetra',
  commonName: 'cardinal tetra',
  scientificName: 'Paracheirodon axelrodi',
  ranges: { ph: { min: 7, max: 7.6 } },
};

function tank(
  parameters: ParameterFacts[],
  options: { inhabitants?: LivestockInhabitant[]; openAlerts?: OpenAlertFact[] } = {},
) {
  return judgeTank(
    { parameters, inhabitants: options.inhabitants ?? [], openAlerts: options.openAlerts ?? [] },
    now,
  );
}

describe('judgeTank', () => {
  it('is healthy with every watched reading current and inside its limits and the comfort range', () => {
    const verdict = tank(
      [
        { parameter: 'ph', limits: phLimits, latest: homeTest(7.2, ago(hours(3))) },
        { parameter: 'temperature', limits: temperatureLimits, latest: homeTest(25, ago(hours(3))) },
      ],
      { inhabitants: [cardinal] },
    );

    expect(verdict.status).toBe('healthy');
    expect(verdict.reason).toBe('All 2 watched readings are current and in range');
    expect(verdict.parameters.map((p) => [p.parameter, p.health])).toEqual([
      ['ph', 'in-range'],
      ['temperature', 'in-range'],
    ]);
  });

  it('is watch when open warning alerts say so, even with every reading in range, and lists them', () => {
    const verdict = tank(
      [{ parameter: 'temperature', limits: temperatureLimits, latest: homeTest(25, ago(hours(1))) }],
      {
        openAlerts: [
          {
            kind: 'device-stale',
            severity: 'warning',
            parameter: null,
            title: 'No recent readings from Sump probe',
          },
          { kind: 'rate', severity: 'warning', parameter: 'salinity', title: 'Salinity rising fast' },
          { kind: 'test-overdue', severity: 'notice', parameter: 'alkalinity', title: 'Alkalinity test due' },
        ],
      },
    );

    expect(verdict.status).toBe('watch');
    expect(verdict.reason).toBe('2 open alerts: No recent readings from Sump probe and Salinity rising fast');
  });

  it('names the first of several concerns in full and counts the rest, so a card stays short', () => {
    const verdict = tank([
      { parameter: 'ph', limits: phLimits, latest: homeTest(6.4, ago(hours(1))) },
      { parameter: 'temperature', limits: temperatureLimits, latest: homeTest(27.5, ago(hours(1))) },
    ]);

    expect(verdict.status).toBe('watch');
    expect(verdict.reason).toMatch(/^pH 6\.40? is below the warning limit of 6\.5, and 1 more concern$/);
  });

  it('is alert with an open critical alert, and the parameter tile it concerns agrees', () => {
    const verdict = tank(
      [{ parameter: 'temperature', limits: temperatureLimits, latest: homeTest(26.9, ago(hours(1))) }],
      {
        openAlerts: [
          {
            kind: 'limit',
            severity: 'critical',
            parameter: 'temperature',
            title: 'Temperature critically high',
          },
        ],
      },
    );

    expect(verdict.status).toBe('alert');
    expect(verdict.parameters[0]).toMatchObject({
      health: 'critical',
      reason: 'Open alert: Temperature critically high',
    });
    expect(verdict.reason).toBe('Open alert: Temperature critically high');
  });

  it('names the limit a reading is beyond, critical before warning', () => {
    const critical = tank([
      { parameter: 'temperature', limits: temperatureLimits, latest: homeTest(29, ago(days(3))) },
    ]);
    const warning = tank([
      { parameter: 'temperature', limits: temperatureLimits, latest: homeTest(27.5, ago(hours(1))) },
    ]);

    expect([critical.status, critical.reason]).toEqual([
      'alert',
      'Temperature 29.0 °C is above the critical limit of 28.5 °C',
    ]);
    expect([warning.status, warning.reason]).toEqual([
      'watch',
      'Temperature 27.5 °C is above the warning limit of 27 °C',
    ]);
  });

  it('is watch for a reading inside the limits but outside what the livestock tolerate, tile and tank alike', () => {
    const verdict = tank([{ parameter: 'ph', limits: phLimits, latest: homeTest(6.9, ago(hours(2))) }], {
      inhabitants: [cardinal],
    });

    expect(verdict.status).toBe('watch');
    expect(verdict.parameters[0]!.health).toBe('warning');
    expect(verdict.reason).toBe(
      'pH 6.90 is below what the cardinal tetra (Paracheirodon axelrodi) tolerates (min 7)',
    );
    expect(verdict.parameters[0]!.reason).toBe(verdict.reason);
  });

  it('names many species in a short list, with the edge of the comfort range', () => {
    const many = [
      cardinal,
      fish('otocinclus', 'otocinclus', { min: 6.8, max: 7.5 }),
      ...Array.from({ length: 7 }, (_, i) => fish(`tetra-${i}`, `tetra ${i}`, { min: 6.95, max: 8 })),
    ];
    const verdict = tank([{ parameter: 'ph', limits: phLimits, latest: homeTest(6.4, ago(hours(2))) }], {
      inhabitants: many,
    });

    expect(verdict.reason).toBe(
      'pH 6.40 is below the warning limit of 6.5 and below what the cardinal tetra, otocinclus and 7 more tolerate (min 7)',
    );
  });

  it('keeps a comfort-range breach at watch however old it is', () => {
    const verdict = tank([{ parameter: 'ph', limits: phLimits, latest: homeTest(6.9, ago(days(30))) }], {
      inhabitants: [cardinal],
    });
    expect([verdict.status, verdict.parameters[0]!.health]).toEqual(['watch', 'warning']);
  });

  it('counts a parameter with no limits once the livestock make a concern of it', () => {
    const verdict = tank([{ parameter: 'ph', limits: null, latest: homeTest(6.9, ago(hours(2))) }], {
      inhabitants: [cardinal],
    });
    expect([verdict.status, verdict.parameters[0]!.watched]).toEqual(['watch', true]);
  });

  it('judges device data by the device’s own interval: 38 minutes old is current for an hourly device', () => {
    const last = ago(minutes(38));
    const hourly = tank([
      {
        parameter: 'temperature',
        limits: temperatureLimits,
        latest: device(25, last),
        deviceGapsMs: reportsEvery(hours(1), last),
      },
    ]);
    const everyFive = tank([
      {
        parameter: 'temperature',
        limits: temperatureLimits,
        latest: device(25, last),
        deviceGapsMs: reportsEvery(minutes(5), last),
      },
    ]);

    expect(hourly.status).toBe('healthy');
    expect(hourly.parameters[0]!.freshForMs).toBe(hours(3));
    expect(everyFive.status).toBe('no-data');
    expect(everyFive.parameters[0]!.freshForMs).toBe(minutes(30));
    expect(everyFive.reason).toBe('No reading for 38 minutes');
  });

  it('calls an hourly device’s data stale after three of its intervals, not at them', () => {
    const facts = (at: Date): ParameterFacts => ({
      parameter: 'temperature',
      limits: temperatureLimits,
      latest: device(25, at),
      deviceGapsMs: reportsEvery(hours(1), at),
    });

    expect(tank([facts(ago(hours(3)))]).status).toBe('healthy');
    expect(tank([facts(ago(hours(3) + 1))]).status).toBe('no-data');
  });

  it('judges a home test by the parameter’s testing interval, and says how long it has been', () => {
    const limits: ParameterLimits = { warnLow: 7, warnHigh: 11, critLow: 6, critHigh: 12 };
    const onTime = tank([{ parameter: 'alkalinity', limits, latest: homeTest(8.5, ago(days(7))) }]);
    const late = tank([
      { parameter: 'alkalinity', limits, latest: homeTest(8.5, ago(days(8))) },
      { parameter: 'temperature', limits: temperatureLimits, latest: homeTest(25, ago(hours(2))) },
    ]);

    expect(onTime.status).toBe('healthy');
    expect(late.status).toBe('watch');
    expect(late.reason).toBe('No Alkalinity reading for 8 days');
    expect(late.parameters[0]!.health).toBe('stale');
  });

  it('has no recent data when nothing watched is current, or nothing is watched', () => {
    const quiet = tank([
      { parameter: 'temperature', limits: temperatureLimits, latest: homeTest(25, ago(days(3))) },
      { parameter: 'ph', limits: phLimits, latest: null },
    ]);
    const unwatched = tank([{ parameter: 'temperature', limits: null, latest: homeTest(25, ago(hours(1))) }]);

    expect([quiet.status, quiet.reason]).toEqual(['no-data', 'No reading for 3 days']);
    expect(quiet.parameters[1]!.reason).toBe('No pH reading yet');
    expect([unwatched.status, unwatched.reason]).toEqual([
      'no-data',
      'No parameter is watched: no limits are set',
    ]);
  });
});

describe('deviceStaleAfter', () => {
  it('is three times the median gap between reports, at least 30 minutes', () => {
    expect(deviceStaleAfter([hours(1), hours(1), minutes(2), hours(1)])).toBe(hours(3));
    expect(deviceStaleAfter([minutes(5), minutes(5), minutes(5)])).toBe(minutes(30));
    expect(deviceStaleAfter([minutes(20), minutes(20)])).toBe(minutes(60));
  });

  it('falls back to 30 minutes with too few reports to know the rhythm', () => {
    expect(deviceStaleAfter([])).toBe(minutes(30));
    expect(deviceStaleAfter(reportingGaps([now]))).toBe(minutes(30));
  });

  it('takes the gaps between distinct report times, whatever order they come in', () => {
    expect(reportingGaps([ago(hours(1)), now, now, ago(hours(3))])).toEqual([hours(1), hours(2)]);
  });
});

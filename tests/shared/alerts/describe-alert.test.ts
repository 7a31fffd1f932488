import { describe, expect, it } from 'vitest';
import { describeAlert, formatDuration } from '@shared/alerts/describe-alert';
import { evaluateLivestock } from '@shared/alerts/livestock';
import { evaluateRate } from '@shared/alerts/rate';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { days, hours, minutes } from '../../helpers/clock';

const at = new Date('2026-12-03T14:05:00Z');
const context = { tankName: 'Lobby reef', timeZone: 'Europe/London' };

describe('describeAlert', () => {
  it('names the tank, parameter, value with unit, limit and time when a limit alert opens', () => {
    const description = describeAlert(
      {
        kind: 'limit',
        action: 'open',
        parameter: 'temperature',
        value: 27.43,
        measuredAt: at,
        source: 'device',
        severity: 'warning',
        direction: 'high',
        limit: 27,
      },
      context,
    );

    expect(description).toMatchObject({
      kind: 'limit',
      severity: 'warning',
      title: 'Temperature high in Lobby reef',
      body: 'Temperature 27.4 °C is above the warning limit of 27 °C. Measured by the tank’s device at 3 Dec 2026, 14:05.',
    });
  });

  it('says "critically" and carries first steps for a critical alert', () => {
    const description = describeAlert(
      {
        kind: 'limit',
        action: 'escalate',
        parameter: 'temperature',
        value: 29.1,
        measuredAt: at,
        source: 'home-test',
        severity: 'critical',
        direction: 'high',
        limit: 28.5,
      },
      context,
    );

    expect(description.title).toBe('Temperature critically high in Lobby reef');
    expect(description.body).toBe(
      'Temperature has risen to 29.1 °C, above the critical limit of 28.5 °C. Measured in a home test at 3 Dec 2026, 14:05.',
    );
    expect(description.firstSteps?.steps[0]).toMatch(/heater off at the wall/);
  });

  it('writes the values in the reader’s unit', () => {
    const { body } = describeAlert(
      {
        kind: 'limit',
        action: 'open',
        parameter: 'alkalinity',
        value: 6.5,
        measuredAt: at,
        source: 'visit',
        severity: 'warning',
        direction: 'low',
        limit: 7,
      },
      { ...context, units: { alkalinity: 'meq/L' } },
    );

    expect(body).toBe(
      'Alkalinity 2.32 meq/L is below the warning limit of 2.5 meq/L. Measured at a visit at 3 Dec 2026, 14:05.',
    );
  });

  it('tells the owner when the water is back within limits, as a notice', () => {
    const description = describeAlert(
      {
        kind: 'limit',
        action: 'resolve',
        parameter: 'ph',
        value: 8.3,
        measuredAt: at,
        source: 'device',
        severity: 'warning',
        direction: 'high',
        limit: 8.45,
      },
      context,
    );

    expect(description).toMatchObject({
      severity: 'notice',
      title: 'pH back within limits in Lobby reef',
      firstSteps: null,
    });
    expect(description.body).toMatch(/^pH 8\.30 is back inside the warning limit of 8\.45\./);
  });

  it('describes a rate alert with the change, the time it took and the rule', () => {
    const start = at.getTime() - minutes(50);
    const { breach } = evaluateRate(
      [
        { value: 25.8, measuredAt: new Date(start) },
        { value: 27, measuredAt: at },
      ],
      parameterCatalogue.temperature.rateOfChange!,
    );

    const { title, body } = describeAlert(
      {
        kind: 'rate',
        parameter: 'temperature',
        breach: breach!,
        rule: parameterCatalogue.temperature.rateOfChange!,
      },
      { ...context, units: { temperature: '°F' } },
    );

    expect(title).toBe('Temperature rising fast in Lobby reef');
    // A 1.2 °C rise is 2.16 °F; the rule of 1 °C an hour is 1.8 °F an hour.
    expect(body).toBe(
      'Temperature rose by 2.2 °F in 50 minutes, faster than the tank’s limit of 1.8 °F an hour. Now 80.6 °F at 3 Dec 2026, 14:05.',
    );
  });

  it('describes a silent device with how long it has been quiet', () => {
    const description = describeAlert(
      { kind: 'device-stale', deviceName: 'Sump probe', lastSeen: at, silentForMs: minutes(45) },
      context,
    );

    expect(description.title).toBe('No recent readings from Sump probe in Lobby reef');
    expect(description.body).toMatch(
      /^Sump probe last sent a reading at 3 Dec 2026, 14:05, 45 minutes ago\./,
    );
    expect(description.firstSteps?.cautions.join(' ')).toMatch(/licensed electrician/);
  });

  it('says so when a silent device has never reported', () => {
    const description = describeAlert(
      { kind: 'device-stale', deviceName: 'Sump probe', lastSeen: null, silentForMs: minutes(45) },
      context,
    );

    expect(description.body).toMatch(/^Sump probe has sent no reading since it was added 45 minutes ago\./);
  });

  it('reminds, with low urgency, when a home test is overdue', () => {
    const description = describeAlert(
      {
        kind: 'test-overdue',
        parameter: 'alkalinity',
        lastMeasuredAt: at,
        intervalMs: days(7),
        now: new Date(at.getTime() + days(9)),
      },
      context,
    );

    expect(description).toMatchObject({
      severity: 'notice',
      title: 'Alkalinity test due in Lobby reef',
      body: 'Alkalinity was last tested 9 days ago, at 3 Dec 2026, 14:05; it is usually tested every 7 days.',
    });
  });

  it('lists each affected species in a livestock alert', () => {
    const concerns = evaluateLivestock('temperature', 29.4, [
      {
        speciesId: 'hammer-coral',
        commonName: 'hammer coral',
        scientificName: 'Fimbriaphyllia ancora',
        ranges: { temperature: { min: 24, max: 28 } },
      },
    ]);

    const { body } = describeAlert(
      { kind: 'livestock', parameter: 'temperature', value: 29.4, measuredAt: at, concerns },
      context,
    );

    expect(body).toBe(
      'Temperature 29.4 °C is above what the hammer coral (Fimbriaphyllia ancora) tolerates (max 28 °C). Measured at 3 Dec 2026, 14:05.',
    );
  });

  it('names the livestock at risk in the one limit alert a reading opens', () => {
    const concerns = evaluateLivestock('temperature', 29.4, [
      {
        speciesId: 'hammer-coral',
        commonName: 'hammer coral',
        scientificName: 'Fimbriaphyllia ancora',
        ranges: { temperature: { min: 24, max: 28 } },
      },
    ]);

    const { body } = describeAlert(
      {
        kind: 'limit',
        action: 'open',
        parameter: 'temperature',
        value: 29.4,
        measuredAt: at,
        source: 'home-test',
        severity: 'critical',
        direction: 'high',
        limit: 29,
        concerns,
      },
      context,
    );

    expect(body).toBe(
      'Temperature 29.4 °C is above the critical limit of 29 °C. It is also above what the hammer coral ' +
        '(Fimbriaphyllia ancora) tolerates (max 28 °C). Measured in a home test at 3 Dec 2026, 14:05.',
    );
  });

  it('explains free ammonia from the total, pH and temperature, without the developers’ source note', () => {
    const { title, body, firstSteps } = describeAlert(
      {
        kind: 'free-ammonia',
        totalAmmonia: 0.5,
        pH: 8,
        tempC: 25,
        freeAmmonia: 0.0268,
        severity: 'warning',
        measuredAt: at,
      },
      context,
    );

    expect(title).toBe('Harmful free ammonia in Lobby reef');
    expect(body).toBe(
      'Total ammonia 0.50 mg/L at pH 8.00 and 25.0 °C means about 0.027 mg/L of free ammonia (NH3), above the warning level of 0.02 mg/L. Measured at 3 Dec 2026, 14:05.',
    );
    expect(firstSteps?.steps).toContain('Stop feeding for a day.');
  });
});

describe('formatDuration', () => {
  it('rounds to the unit a person would use', () => {
    expect([minutes(1), minutes(45), hours(3), hours(30), days(9)].map(formatDuration)).toEqual([
      '1 minute',
      '45 minutes',
      '3 hours',
      '30 hours',
      '9 days',
    ]);
  });
});

describe('describeAlert reading against its limit', () => {
  const salinity = (value: number, action: 'open' | 'resolve') =>
    describeAlert(
      {
        kind: 'limit',
        action,
        parameter: 'salinity',
        value,
        measuredAt: at,
        source: 'home-test',
        severity: 'warning',
        direction: 'high',
        limit: 36,
      },
      context,
    ).body;

  it('never writes "36.0 ppt is above … 36 ppt": both get the decimals that tell them apart', () => {
    expect(salinity(36.04, 'open')).toMatch(
      /^Salinity 36\.04 ppt is above the warning limit of 36\.00 ppt\. /,
    );
    expect(salinity(35.97, 'resolve')).toMatch(
      /^Salinity 35\.97 ppt is back inside the warning limit of 36\.00 ppt\. /,
    );
  });

  it('keeps the usual short forms when the reading and the limit already differ', () => {
    expect(salinity(36.2, 'open')).toMatch(/^Salinity 36\.2 ppt is above the warning limit of 36 ppt\. /);
  });
});

import { describe, expect, it } from 'vitest';
import { cautions, deviceStaleFirstSteps, firstSteps } from '@shared/alerts/first-steps';
import { parameterKeys } from '@shared/parameters/keys';
import { limitDirections, limitSeverities } from '@shared/parameters/limits';

describe('firstSteps', () => {
  it('tells the owner to switch the heater off at the wall with dry hands when temperature is critically high', () => {
    const { steps, cautions: shown } = firstSteps('temperature', 'high', 'critical');

    expect(steps[0]).toMatch(/heater off at the wall, with dry hands/);
    expect(steps.join(' ')).toMatch(/gradually/);
    expect(shown).toContain(cautions.electricity);
  });

  it('tops up with fresh RO water gradually when salinity is rising', () => {
    const { steps } = firstSteps('salinity', 'high', 'critical');

    expect(steps.join(' ')).toMatch(/fresh RO water, never salt water, a little at a time/);
  });

  it('stops feeding and changes water with matched water for ammonia', () => {
    const { steps, cautions: shown } = firstSteps('ammonia', 'high', 'critical');

    expect(steps).toContain('Stop feeding for a day.');
    expect(steps.join(' ')).toMatch(/matched to the tank/);
    expect(shown).toContain(cautions.livestock);
  });

  it('always carries the electrician and local-codes caution with critical steps', () => {
    for (const parameter of parameterKeys) {
      for (const direction of limitDirections) {
        const { cautions: shown } = firstSteps(parameter, direction, 'critical');

        expect(shown.join(' ')).toMatch(/licensed electrician; follow local codes/);
        expect(shown).toContain(cautions.general);
      }
    }
  });

  it('gives fewer, gentler steps for a warning, starting with a retest', () => {
    const warning = firstSteps('temperature', 'high', 'warning');
    const critical = firstSteps('temperature', 'high', 'critical');

    expect(warning.steps[0]).toMatch(/Test again/);
    expect(warning.steps.length).toBeLessThan(critical.steps.length);
  });

  it('has steps for every parameter, side and severity', () => {
    for (const parameter of parameterKeys) {
      for (const direction of limitDirections) {
        for (const severity of limitSeverities) {
          expect(firstSteps(parameter, direction, severity).steps.length).toBeGreaterThanOrEqual(2);
        }
      }
    }
  });

  it('asks to look, not touch, when a device goes quiet', () => {
    const { steps, cautions: shown } = deviceStaleFirstSteps();

    expect(steps[0]).toMatch(/do not touch anything wet/);
    expect(shown).toContain(cautions.electricity);
  });
});

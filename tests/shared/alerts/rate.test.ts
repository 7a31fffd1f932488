import { describe, expect, it } from 'vitest';
import { evaluateRate } from '@shared/alerts/rate';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { createTestClock, days, hours, minutes } from '../../helpers/clock';
import { seriesStart } from './reading-series';

const temperatureRule = parameterCatalogue.temperature.rateOfChange!;
const alkalinityRule = parameterCatalogue.alkalinity.rateOfChange!;

function timed(points: readonly [offsetMs: number, value: number][]) {
  const start = createTestClock(new Date(seriesStart)).now().getTime();
  return points.map(([offset, value]) => ({ value, measuredAt: new Date(start + offset) }));
}

describe('evaluateRate', () => {
  it('flags temperature climbing more than 1 °C within an hour (a heater stuck on)', () => {
    const readings = timed([
      [0, 25.8],
      [minutes(20), 26.2],
      [minutes(40), 26.7],
      [minutes(50), 27],
    ]);

    const { breach } = evaluateRate(readings, temperatureRule);

    expect(breach).toMatchObject({ direction: 'rising', elapsedMs: minutes(50) });
    expect(breach?.change).toBeCloseTo(1.2, 10);
  });

  it('does not scale a short gap up: 0.3 °C in five minutes is not "3.6 °C an hour"', () => {
    const { breach, settled } = evaluateRate(
      timed([
        [0, 25],
        [minutes(5), 25.3],
      ]),
      temperatureRule,
    );

    expect(breach).toBeNull();
    expect(settled).toBe(true);
  });

  it('averages a longer gap back to the rule: daily alkalinity tests 25 hours apart still count', () => {
    const { breach } = evaluateRate(
      timed([
        [0, 8],
        [hours(25), 9.5],
      ]),
      alkalinityRule,
    );

    expect(breach?.direction).toBe('rising');
    expect(breach?.change).toBeCloseTo((1.5 * 24) / 25, 10);
  });

  it('flags a fall as well as a rise', () => {
    const { breach } = evaluateRate(
      timed([
        [0, 9],
        [days(1), 7.6],
      ]),
      alkalinityRule,
    );

    expect(breach?.direction).toBe('falling');
    expect(breach?.change).toBeCloseTo(-1.4, 10);
  });

  it('is not settled while the change sits between half the rule and the rule, so the alert cannot flap', () => {
    const { breach, settled } = evaluateRate(
      timed([
        [0, 25],
        [hours(1), 25.7],
      ]),
      temperatureRule,
    );

    expect(breach).toBeNull();
    expect(settled).toBe(false);
  });

  it('sorts the window itself and says nothing with a single reading', () => {
    const shuffled = timed([
      [hours(1), 27],
      [0, 25.5],
    ]);

    expect(evaluateRate(shuffled, temperatureRule).breach?.from.value).toBe(25.5);
    expect(evaluateRate(shuffled.slice(0, 1), temperatureRule)).toEqual({
      breach: null,
      settled: true,
      worstChange: null,
    });
  });
});

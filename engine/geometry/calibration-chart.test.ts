import { describe, expect, it } from 'vitest';
import { buildTank, calibrationChart, type Tank } from './index.js';

const tankOf = (spec: unknown): Tank => {
  const r = buildTank(spec);
  if (!r.ok) throw new Error(r.error);
  return r.value;
};

describe('calibrationChart', () => {
  it('lists level -> volume at the step, in the tank units, ending at full', () => {
    // Horizontal 48 in x 96 in flat-ended cylinder, 1 in steps; full = pi 24^2 96 in^3 / 231 in^3 per gal (NIST HB 44).
    const tank = tankOf({
      units: { length: 'in', volume: 'gal' },
      shape: 'horizontal-cylinder',
      diameter: 48,
      length: 96,
    });
    const chart = calibrationChart(tank, 1);
    if (!chart.ok) throw new Error(chart.error);
    expect(chart.value).toHaveLength(49);
    expect(chart.value[0]).toEqual({ level: 0, volume: 0 });
    expect(chart.value[24]!.volume).toBeCloseTo((Math.PI * 24 * 24 * 96) / 2 / 231, 8);
    expect(chart.value[48]!.level).toBe(48);
    expect(chart.value[48]!.volume).toBeCloseTo((Math.PI * 24 * 24 * 96) / 231, 8);
    for (let i = 1; i < chart.value.length; i++)
      expect(chart.value[i]!.volume).toBeGreaterThan(chart.value[i - 1]!.volume);
  });

  it('adds the full height when the step does not land on it, and starts a strapping chart at its first row', () => {
    const tank = tankOf({
      units: { length: 'cm', volume: 'L' },
      shape: 'strapping',
      table: [
        [5, 10],
        [25, 110],
      ],
    });
    const chart = calibrationChart(tank, 6);
    if (!chart.ok) throw new Error(chart.error);
    expect(chart.value.map((r) => r.level)).toEqual([5, 11, 17, 23, 25]);
    expect(chart.value[1]!.volume).toBeCloseTo(40, 9);
  });

  it('refuses a step that is not positive or gives too many rows', () => {
    const tank = tankOf({ units: { length: 'm', volume: 'L' }, shape: 'sphere', diameter: 2 });
    const zero = calibrationChart(tank, 0);
    expect(zero.ok ? '' : zero.error).toMatch(/positive number of m/);
    const tiny = calibrationChart(tank, 1e-6);
    expect(tiny.ok ? '' : tiny.error).toMatch(/choose a larger step/);
  });
});

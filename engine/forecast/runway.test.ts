import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { runwayTo } from './runway.js';

const DAY = 86_400_000;
const point = (volume: number, rate: number, spread: number) => ({
  time: Date.UTC(2026, 0, 1),
  volume,
  rate,
  rateLow: rate - spread,
  rateHigh: rate + spread,
});

describe('runwayTo', () => {
  it('divides the distance to the target by the rate, with a range from the rate range', () => {
    // 800 L above a 200 L target at 40 L/day: 20 days; at 50 and 32 L/day: 16 and 25 days.
    const r = runwayTo({ ...point(1000, 40, 0), rateLow: 32, rateHigh: 50 }, { volume: 200 });
    expect(r.days).toBe(20);
    expect(r.daysLow).toBe(16);
    expect(r.daysHigh).toBe(25);
    expect(r.runoutAt).toBe(Date.UTC(2026, 0, 21));
  });

  it('has no runway when the tank is not emptying, and no upper end when the slow end is not', () => {
    expect(runwayTo(point(500, -5, 1), { volume: 0 }).days).toBeNull();
    const wide = runwayTo(point(500, 10, 15), { volume: 0 });
    expect(wide.days).toBe(50);
    expect(wide.daysHigh).toBeNull();
    expect(wide.daysLow).toBe(20);
  });

  it('is zero at or below the target', () => {
    expect(runwayTo(point(100, 10, 1), { volume: 150 })).toEqual({
      days: 0,
      daysLow: 0,
      daysHigh: 0,
      runoutAt: Date.UTC(2026, 0, 1),
    });
  });

  it('runs up to the target on a filling tank', () => {
    const r = runwayTo(point(2000, -100, 20), { volume: 7000 }, { filling: true, capacity: 8000 });
    expect(r.days).toBe(50);
    expect(r.daysLow).toBeCloseTo(5000 / 120, 9);
    expect(r.daysHigh).toBeCloseTo(5000 / 80, 9);
    expect(r.runoutAt).toBe(Date.UTC(2026, 0, 1) + 50 * DAY);
  });

  it('keeps low <= days <= high whenever all exist', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: 0, max: 300, noNaN: true }),
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.boolean(),
        (volume, rate, spread, target, filling) => {
          const r = runwayTo(point(volume, rate, spread), { volume: target }, { filling });
          if (r.days !== null && r.daysLow !== null) expect(r.daysLow).toBeLessThanOrEqual(r.days);
          if (r.days !== null && r.daysHigh !== null) expect(r.daysHigh).toBeGreaterThanOrEqual(r.days);
          if (r.days !== null) expect(r.days).toBeGreaterThanOrEqual(0);
        },
      ),
    );
  });

  it('answers null, not NaN, for non-finite input', () => {
    expect(runwayTo(point(Number.NaN, 5, 1), { volume: 0 }).days).toBeNull();
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type FilterState, type Prediction, update, updateShaped } from './kalman.js';

describe('updateShaped', () => {
  const state = (): FilterState => ({ v: 1000, r: 50, p00: 40, p01: -3, p11: 9 });
  const pr: Prediction = { v: 990, p00: 60, p01: -4, p11: 10 };

  it('is the plain update when the reading carries no use shape', () => {
    fc.assert(
      fc.property(fc.double({ min: -100, max: 100, noNaN: true }), (e) => {
        const a = state();
        const b = state();
        update(a, pr, e, 25);
        updateShaped(b, pr, e, 25, 0);
        for (const k of ['v', 'r', 'p00', 'p01', 'p11'] as const) expect(b[k]).toBeCloseTo(a[k], 9);
      }),
    );
  });

  it('after a change (rate unsure) moves the rate more on a reading with more use shape, and its variance less', () => {
    const unsure: Prediction = { v: 990, p00: 100, p01: 0, p11: 10_000 };
    const night = state();
    const working = state();
    updateShaped(night, unsure, -30, 100, 0.05);
    updateShaped(working, unsure, -30, 100, 0.2);
    expect(Math.abs(working.r - 50)).toBeGreaterThan(Math.abs(night.r - 50));
    expect(working.p11).toBeLessThan(night.p11);
    expect(night.p11).toBeLessThan(unsure.p11);
  });
});

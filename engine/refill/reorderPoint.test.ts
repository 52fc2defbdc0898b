import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { daysToThreshold, reorderPoint } from './reorderPoint.js';
import { serviceFactor } from './serviceFactor.js';

describe('reorderPoint', () => {
  it('reproduces the (s, Q) rule of Silver, Pyke & Thomas on a worked example', () => {
    // Silver, Pyke & Thomas, "Inventory and Production Management in Supply Chains" (4th ed.): s = x̂_L + k σ_L
    // with σ_L = σ_1 √L and k from the unit normal table for P1. The method is reproduced from memory; the
    // numbers are our own example worked by hand in the book's notation, not copied from its pages:
    // x̂_1 = 120 L/day, σ_1 = 30 L, L = 4 days, P1 = 0.95 -> x̂_L = 480, σ_L = 60, k = 1.645 (table),
    // safety stock = 1.645 x 60 = 98.7 L, s = 578.7 L.
    const r = reorderPoint({ demandPerDay: 120, sigmaPerDay: 30, leadTimeDays: 4, serviceLevel: 0.95 });
    expect(r.leadTimeDemand).toBeCloseTo(480, 9);
    expect(r.safetyStock).toBeCloseTo(98.7, 1);
    expect(r.reorderPoint).toBeCloseTo(578.7, 1);
  });

  it('has no safety stock at a 50% service level, and none without uncertainty', () => {
    expect(
      reorderPoint({ demandPerDay: 50, sigmaPerDay: 10, leadTimeDays: 3, serviceLevel: 0.5 }).safetyStock,
    ).toBeCloseTo(0, 9);
    expect(
      reorderPoint({ demandPerDay: 50, sigmaPerDay: 0, leadTimeDays: 3, serviceLevel: 0.99 }).reorderPoint,
    ).toBe(150);
  });

  it('grows the safety stock with the age of the last reading', () => {
    const fresh = reorderPoint({ demandPerDay: 50, sigmaPerDay: 10, leadTimeDays: 4, serviceLevel: 0.95 });
    const stale = reorderPoint({
      demandPerDay: 50,
      sigmaPerDay: 10,
      leadTimeDays: 4,
      serviceLevel: 0.95,
      readingAgeDays: 5,
    });
    // span 9 days instead of 4: sigma_L goes from 10*2 to 10*3
    expect(stale.safetyStock / fresh.safetyStock).toBeCloseTo(1.5, 9);
    expect(stale.leadTimeDemand).toBe(fresh.leadTimeDemand);
  });
});

describe('daysToThreshold', () => {
  it('solves r t + k σ √t = headroom (checked against the quadratic formula in √t)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1e5, noNaN: true }),
        fc.double({ min: 0.1, max: 1000, noNaN: true }),
        fc.double({ min: 0, max: 200, noNaN: true }),
        fc.constantFrom(0.5, 0.9, 0.95, 0.99),
        (headroom, rate, sigma, level) => {
          const t = daysToThreshold(headroom, rate, { sigmaPerDay: sigma }, level, 1e9);
          const k = serviceFactor(level);
          const u = (-k * sigma + Math.sqrt(k * k * sigma * sigma + 4 * rate * headroom)) / (2 * rate);
          expect(t).not.toBeNull();
          expect(Math.abs((t ?? 0) - u * u)).toBeLessThanOrEqual(1e-6 * Math.max(1, u * u));
        },
      ),
    );
  });

  it('counts the rate error as persisting: r t + k s t = headroom when only the rate is uncertain', () => {
    const k = serviceFactor(0.95);
    const t = daysToThreshold(1000, 40, { sigmaPerDay: 0, rateSigma: 5 }, 0.95);
    expect(t).toBeCloseTo(1000 / (40 + k * 5), 6);
    const both = reorderPoint({
      demandPerDay: 40,
      sigmaPerDay: 6,
      rateSigma: 2,
      leadTimeDays: 4,
      serviceLevel: 0.95,
    });
    // sqrt(6^2 x 4 + 2^2 x 16) = sqrt(144 + 64)
    expect(both.safetyStock).toBeCloseTo(k * Math.sqrt(208), 9);
  });

  it('is 0 at or below the threshold, null when the tank is not used or the answer is past the horizon', () => {
    expect(daysToThreshold(0, 10, { sigmaPerDay: 1 }, 0.95)).toBe(0);
    expect(daysToThreshold(-5, 10, { sigmaPerDay: 1 }, 0.95)).toBe(0);
    expect(daysToThreshold(100, 0, { sigmaPerDay: 1 }, 0.95)).toBeNull();
    expect(daysToThreshold(100, -3, { sigmaPerDay: 1 }, 0.95)).toBeNull();
    expect(daysToThreshold(1e9, 0.001, { sigmaPerDay: 0 }, 0.95, 3650)).toBeNull();
  });

  it('comes sooner at a higher service level (a law)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1e4, noNaN: true }),
        fc.double({ min: 0.5, max: 100, noNaN: true }),
        (h, r) => {
          const low = daysToThreshold(h, r, { sigmaPerDay: 5 }, 0.9) ?? Number.POSITIVE_INFINITY;
          const high = daysToThreshold(h, r, { sigmaPerDay: 5 }, 0.99) ?? Number.POSITIVE_INFINITY;
          return high <= low + 1e-9;
        },
      ),
    );
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { serviceFactor } from './serviceFactor.js';

describe('serviceFactor', () => {
  it('matches the standard normal table', () => {
    // Unit normal table (e.g. Silver, Pyke & Thomas, "Inventory and Production Management in Supply Chains",
    // 4th ed., appendix on the normal distribution); values to 4 decimals, from memory: 0.90 -> 1.2816,
    // 0.95 -> 1.6449, 0.975 -> 1.9600, 0.99 -> 2.3263, 0.999 -> 3.0902.
    expect(serviceFactor(0.5)).toBeCloseTo(0, 9);
    expect(serviceFactor(0.9)).toBeCloseTo(1.2816, 4);
    expect(serviceFactor(0.95)).toBeCloseTo(1.6449, 4);
    expect(serviceFactor(0.975)).toBeCloseTo(1.96, 4);
    expect(serviceFactor(0.99)).toBeCloseTo(2.3263, 4);
    expect(serviceFactor(0.999)).toBeCloseTo(3.0902, 4);
  });

  it('never decreases as the service level rises (a law)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 0.9999, noNaN: true }),
        fc.double({ min: 0, max: 0.4999, noNaN: true }),
        (p, d) => {
          const q = Math.min(0.9999, p + d);
          return serviceFactor(q) >= serviceFactor(p);
        },
      ),
    );
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { netFlowEta } from './net-flow.js';

const value = (r: ReturnType<typeof netFlowEta>) => {
  if (!r.ok) throw new Error(r.error);
  return r.value;
};

describe('netFlowEta', () => {
  it('divides the distance to the target by outflow - inflow', () => {
    // 3760 gal at 3 gal/min out and 1 gal/min in: 1880 min = 31.333 h (plain arithmetic, in gal and gal/day).
    const eta = value(netFlowEta({ volume: 3760, inflow: 1440, outflow: 3 * 1440 }));
    expect(eta.state).toBe('emptying');
    expect(eta.netOutflow).toBe(2880);
    expect(eta.days! * 24).toBeCloseTo(31.3333333, 6);
    // Down to 500 gal: 3260 gal / 2 gal/min = 1630 min.
    const toTarget = value(netFlowEta({ volume: 3760, inflow: 1440, outflow: 4320, target: 500 }));
    expect(toTarget.days! * 24 * 60).toBeCloseTo(1630, 9);
  });

  it('gives a filling or steady tank a clear answer instead of a negative or infinite time', () => {
    const filling = value(netFlowEta({ volume: 100, inflow: 50, outflow: 10, capacity: 500 }));
    expect(filling).toMatchObject({ state: 'filling', days: null, netOutflow: -40, daysToFull: 10 });
    expect(filling.message).toMatch(/filling/);
    const steady = value(netFlowEta({ volume: 100, inflow: 10, outflow: 10 }));
    expect(steady).toMatchObject({ state: 'steady', days: null, daysToFull: null });
    expect(value(netFlowEta({ volume: 40, inflow: 0, outflow: 10, target: 50 }))).toMatchObject({
      state: 'at-target',
      days: 0,
    });
  });

  it('calls a vanishing net outflow steady rather than an infinite time', () => {
    const eta = value(netFlowEta({ volume: 1e6, inflow: 0, outflow: 5e-324 }));
    expect(eta).toMatchObject({ state: 'steady', days: null });
  });

  it('refuses impossible inputs', () => {
    expect(netFlowEta({ volume: -1, inflow: 0, outflow: 1 }).ok).toBe(false);
    expect(netFlowEta({ volume: 1, inflow: Number.NaN, outflow: 1 }).ok).toBe(false);
    expect(netFlowEta({ volume: 600, inflow: 0, outflow: 1, capacity: 500 }).ok).toBe(false);
    expect(netFlowEta({ volume: 100, inflow: 0, outflow: 1, target: 600, capacity: 500 }).ok).toBe(false);
  });

  it('never returns a negative or non-finite time (fast-check)', () => {
    const amount = fc.double({ min: 0, max: 1e7, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(amount, amount, amount, amount, (volume, inflow, outflow, target) => {
        const eta = value(netFlowEta({ volume, inflow, outflow, target }));
        if (eta.days !== null) {
          expect(eta.days).toBeGreaterThanOrEqual(0);
          expect(Number.isFinite(eta.days)).toBe(true);
          // Days times the net outflow walks back exactly the distance to the target.
          if (eta.state === 'emptying') expect(eta.days * eta.netOutflow).toBeCloseTo(volume - target, 3);
        }
      }),
    );
  });
});

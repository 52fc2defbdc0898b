// The runs rule on the use between manual dips (interval-rates.ts), on a filter state set up by hand.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkIntervalRates, noteLoggedForIntervals } from './interval-rates.js';
import { initialState } from './state.js';
import type { RateEstimatorState } from './types.js';

const DAY = 86_400_000;

/** A filter that trusts 100 L/day (sd 2 L/day) with a dip noise of 10 L, on a 10 000 L tank. */
function steadyAt100(): RateEstimatorState {
  const s = initialState({ capacity: 10_000 });
  Object.assign(s, { count: 20, r: 100, p11: 4, p00: 50, innovationVar: 150, dtMean: 1, lastTime: 0 });
  return s;
}

/** Feeds dips a day apart falling by `drops` litres each; returns on which dip the rate was re-learnt. */
function feed(s: RateEstimatorState, drops: number[]): number[] {
  let volume = 8000;
  const relearnt: number[] = [];
  checkIntervalRates(s, 0, volume);
  drops.forEach((drop, k) => {
    volume -= drop;
    if (checkIntervalRates(s, (k + 1) * DAY, volume)) relearnt.push(k + 1);
  });
  return relearnt;
}

describe('change of use from the intervals between manual dips', () => {
  it('re-learns the rate when three of the last four intervals agree on another one', () => {
    const s = steadyAt100();
    expect(feed(s, [100, 300, 100, 300, 300])).toEqual([5]);
    // The agreeing intervals' mean (all a day long): 300 L/day, and a change is marked from the first.
    expect(s.r).toBeCloseTo(300, 6);
    expect(s.changePending).toMatchObject({ at: 1 * DAY, from: 100 });
    expect(s.dipIntervals).toEqual([]);
  });

  it('takes one steep interval (a withdrawal, a typo) among steady ones for no change', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 7 }), fc.integer({ min: 400, max: 3000 }), (at, extra) => {
        const drops = Array.from({ length: 8 }, (_, k) => (k === at ? 100 + extra : 100));
        const s = steadyAt100();
        expect(feed(s, drops)).toEqual([]);
        expect(s.r).toBe(100);
      }),
    );
  });

  it('skips an interval with a rise in it and counts a logged delivery as use made up', () => {
    const s = steadyAt100();
    checkIntervalRates(s, 0, 8000);
    checkIntervalRates(s, DAY, 7700); // 300 L/day
    checkIntervalRates(s, 2 * DAY, 9000); // a rise: a delivery, nothing about the rate
    expect(s.dipIntervals).toHaveLength(1);
    noteLoggedForIntervals(s, 2.5 * DAY, 2000);
    checkIntervalRates(s, 3 * DAY, 9000 + 2000 - 300); // the dip shows a rise: a logged truck and 300 L of use
    expect(s.dipIntervals.map((i) => i.use)).toEqual([300, 300]);
    expect(checkIntervalRates(s, 4 * DAY, 10_400)).toBe(true);
    expect(s.r).toBeCloseTo(300, 6);
  });

  it('learns slower use the same way', () => {
    const s = steadyAt100();
    expect(feed(s, [30, 30, 30])).toEqual([3]);
    expect(s.r).toBeCloseTo(30, 6);
  });
});

import { describe, expect, it } from 'vitest';
import { normals } from '../../test/support/normals.js';
import { checkSlope } from './slope-check.js';
import { initialState } from './state.js';

const DAY = 86_400_000;
const HOUR = 3_600_000;

/**
 * An hourly sensor's state after two days of kept readings `volumeAt(t)` (plus noise of 20 L): the filter
 * still at 300 L/day, its CUSUM leaning towards faster use, no daily profile learnt.
 */
function stateWith(volumeAt: (t: number) => number) {
  const s = initialState({ capacity: 10_000 });
  const gauss = normals(5);
  s.dtMean = 1 / 24;
  s.r = 300;
  s.count = 48;
  s.cusumNeg = 3;
  for (let t = 0; t < 2 * DAY; t += HOUR) {
    s.recentTimes.push(t);
    s.recentVolumes.push(volumeAt(t) + 20 * gauss());
  }
  return s;
}

const now = 2 * DAY - HOUR;

describe('slope check', () => {
  it('refits when the last day and a half used twice the rate', () => {
    const change = DAY / 2;
    const s = stateWith((t) => 9000 - (300 * Math.min(t, change) + 600 * Math.max(0, t - change)) / DAY);
    checkSlope(s, now, now - HOUR, 400);
    expect(s.r).toBeGreaterThan(480);
    expect(s.r).toBeLessThan(720);
    expect(s.changePending).not.toBeNull();
  });

  it('leaves the rate alone when a level shift at the old rate explains the window (a small withdrawal)', () => {
    const s = stateWith((t) => 9000 - (300 * t) / DAY - (t >= DAY ? 400 : 0));
    checkSlope(s, now, now - HOUR, 400);
    expect(s.r).toBe(300);
    expect(s.changePending).toBeNull();
  });

  it('waits for the CUSUM to lean the same way', () => {
    const change = DAY / 2;
    const s = stateWith((t) => 9000 - (300 * Math.min(t, change) + 600 * Math.max(0, t - change)) / DAY);
    s.cusumNeg = 1;
    checkSlope(s, now, now - HOUR, 400);
    expect(s.r).toBe(300);
  });

  it('runs once per hour of data', () => {
    const change = DAY / 2;
    const s = stateWith((t) => 9000 - (300 * Math.min(t, change) + 600 * Math.max(0, t - change)) / DAY);
    checkSlope(s, now + 20 * 60_000, now + 10 * 60_000, 400);
    expect(s.r).toBe(300);
  });
});

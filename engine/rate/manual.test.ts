// Manual readings (a crew's dips, a day or more apart): patterns that failed on generated scenario seeds of
// the accuracy bench (bench/accuracy), each cut down to the few readings that show it.
import { describe, expect, it } from 'vitest';
import { normals } from '../../test/support/normals.js';
import {
  analyzeSeries,
  createRateEstimator,
  isRateEstimatorState,
  type RateEstimatorState,
  restoreRateEstimator,
  type TimedVolume,
} from './index.js';

const DAY = 86_400_000;

interface DipPlan {
  start: number;
  /** Days of the dips. */
  at: number[];
  /** Use in L/day on a day. */
  rate: (day: number) => number;
  /** Level shifts (deliveries up, withdrawals down) on a day. */
  shifts?: { day: number; volume: number }[];
  /** Rounding of every dip, litres (an inch of the tank). */
  quantum?: number;
  /** Standard deviation of each dip's error before rounding, litres. */
  noise?: number;
}

/** The true level at `day`: use integrated in steps of a hundredth of a day, plus the shifts so far. */
function levelAt(plan: DipPlan, day: number): number {
  let v = plan.start;
  for (let t = 0; t < day; t += 0.01) v -= plan.rate(t) * Math.min(0.01, day - t);
  for (const s of plan.shifts ?? []) if (s.day <= day) v += s.volume;
  return Math.max(0, v);
}

function dips(plan: DipPlan): TimedVolume[] {
  const q = plan.quantum ?? 1;
  const gauss = normals(7);
  return plan.at.map((day) => ({
    time: day * DAY,
    volume: Math.round((levelAt(plan, day) + (plan.noise ?? 0) * gauss()) / q) * q,
  }));
}

/** The dips with `by` litres added to the one on `day` (a typo). */
function typo(readings: TimedVolume[], day: number, by: number): TimedVolume[] {
  return readings.map((r) => (r.time === day * DAY ? { time: r.time, volume: r.volume + by } : r));
}

/** Days from `from` to `to` every `step` days. */
function every(step: number, from: number, to: number): number[] {
  const out: number[] = [];
  for (let day = from; day <= to + 1e-9; day += step) out.push(Math.round(day * 1000) / 1000);
  return out;
}

describe('logged deliveries on manual readings', () => {
  // 300 L/day on a 20 000 L tank dipped every 3.5 days, to the nearest 212 L (an inch).
  const steady = { start: 15_000, at: every(3.5, 0, 42), rate: () => 300, quantum: 212 };

  it('keeps two logged deliveries in consecutive dip intervals as two events', () => {
    // Trucks on days 22 and 25, both logged: together less than the tank holds, so only the logs tell two
    // trucks from one that a dip fell in the middle of.
    const shifts = [
      { day: 22, volume: 6000 },
      { day: 25, volume: 4000 },
    ];
    const logged = [
      { time: 22.1 * DAY, volume: 6000 },
      { time: 25.1 * DAY, volume: 4000 },
    ];
    const { events } = analyzeSeries(dips({ ...steady, shifts }), logged, { capacity: 20_000 });
    expect(events.map((e) => [e.type, e.logged, e.start / DAY])).toEqual([
      ['delivery', true, 22.1],
      ['delivery', true, 25.1],
    ]);
  });

  it('lists a delivery logged after the last dip as a logged event', () => {
    const { events } = analyzeSeries(dips(steady), [{ time: 42.4 * DAY, volume: 5000 }], {
      capacity: 20_000,
    });
    expect(events).toEqual([
      { type: 'delivery', start: 42.4 * DAY, end: 42.4 * DAY, volume: 5000, logged: true },
    ]);
  });

  it('does not take a delivery logged days after an unlogged one seen in the dips for that one', () => {
    // A truck nobody logged on day 9 (seen at the day-10.5 dip), then a logged one on day 13 (seen at the
    // day-14 dip): logged 2.5 days after the first rise was seen, it is another truck.
    const shifts = [
      { day: 9, volume: 5000 },
      { day: 13, volume: 4000 },
    ];
    const { events } = analyzeSeries(dips({ ...steady, shifts }), [{ time: 13 * DAY, volume: 4000 }], {
      capacity: 20_000,
    });
    expect(events.map((e) => [e.logged, e.start / DAY])).toEqual([
      [false, 8.75],
      [true, 13],
    ]);
  });

  it('matches a rise with the delivery logged just before it, not an earlier log still waiting', () => {
    // 200 L logged on day 23 (less than an inch) and 6000 L on day 24, both before the day-24.5 dip.
    const shifts = [
      { day: 23, volume: 200 },
      { day: 24, volume: 6000 },
    ];
    const logged = [
      { time: 23 * DAY, volume: 200 },
      { time: 24 * DAY, volume: 6000 },
    ];
    const { events } = analyzeSeries(dips({ ...steady, shifts }), logged, { capacity: 20_000 });
    expect(events.map((e) => [e.start / DAY, e.logged])).toEqual([
      [24, true],
      [23, true],
    ]);
    expect(Math.abs(events[0]!.volume - 6000)).toBeLessThan(400);
  });
});

describe('a rise on manual dips that the next dip takes back', () => {
  it('is a typo even when a withdrawal came before the next dip', () => {
    // Daily dips at 800 L/day on a 20 000 L tank; day 10 typed 3000 L high, 2000 L drawn off on day 10.5.
    // The day-11 dip is below the line before the rise by the withdrawal, far beyond its noise, but much
    // nearer it than the level the rise would give.
    const plan = {
      start: 19_000,
      at: every(1, 0, 19),
      rate: () => 800,
      shifts: [{ day: 10.5, volume: -2000 }],
      noise: 150,
      quantum: 200,
    };
    const { events, suspects } = analyzeSeries(typo(dips(plan), 10, 3000), [], { capacity: 20_000 });
    expect(events.map((e) => e.type)).toEqual(['withdrawal']);
    expect(suspects.map((x) => x.time / DAY)).toContain(10);
  });

  it('is a typo when a logged delivery before the next dip explains that dip', () => {
    // Dips every 2.3 days at 180 L/day on a 4000 L tank; the day-9.3 dip typed 2100 L high; a truck of
    // 2200 L logged on day 12; the day-13.9 dip shows the truck, not the typo plus the truck.
    const at = [0, 2.3, 4.7, 7, 9.3, 13.9, 16.2, 18.5, 20.9];
    const plan = { start: 3500, at, rate: () => 180, shifts: [{ day: 12, volume: 2200 }], quantum: 42 };
    const { events, suspects } = analyzeSeries(
      typo(dips(plan), 9.3, 2100),
      [{ time: 12 * DAY, volume: 2200 }],
      {
        capacity: 4000,
      },
    );
    expect(events.map((e) => [e.type, e.start / DAY, e.logged])).toEqual([['delivery', 12, true]]);
    expect(suspects.map((x) => x.time / DAY)).toEqual([9.3]);
  });

  it('takes back the rate of the first interval when the second dip was a typo', () => {
    // Daily dips at 150 L/day on a 4000 L tank from 3200 L; the second dip typed 1560 L (the inches reversed).
    // One interval alone would give 1640 L/day, and the third dip a delivery.
    const plan = { start: 3200, at: every(1, 0, 14), rate: () => 150, quantum: 42 };
    const { events, suspects, points } = analyzeSeries(typo(dips(plan), 1, 1560 - 3050), [], {
      capacity: 4000,
    });
    expect(events).toEqual([]);
    expect(suspects.map((x) => x.time / DAY)).toEqual([1]);
    for (const p of points.slice(3)) expect(Math.abs(p.rate - 150)).toBeLessThan(40);
  });
});

describe('the filter kept for the next dip, stored', () => {
  it('resumes exactly from JSON taken while it is kept, and a damaged one is refused', () => {
    const plan = { start: 3200, at: every(1, 0, 14), rate: () => 150, quantum: 42 };
    const readings = typo(dips(plan), 1, -1490);
    const whole = analyzeSeries(readings, [], { capacity: 4000 });
    const first = createRateEstimator({ capacity: 4000 });
    for (const r of readings.slice(0, 2)) first.addReading(r.time, r.volume);
    const state = JSON.parse(JSON.stringify(first.toJSON())) as RateEstimatorState;
    expect(state.undo).not.toBeNull();
    expect(isRateEstimatorState(state)).toBe(true);
    expect(isRateEstimatorState({ ...state, undo: { ...state.undo!, innovationVar: Number.NaN } })).toBe(
      false,
    );
    expect(isRateEstimatorState({ ...state, undo: { ...state.undo!, eventCount: -1 } })).toBe(false);
    const resumed = restoreRateEstimator(state);
    expect(readings.slice(2).map((r) => resumed.addReading(r.time, r.volume))).toEqual(whole.points.slice(2));
  });
});

describe('where a delivery after a low dip starts', () => {
  it('is after the low dip, not before it', () => {
    // Daily dips at 900 L/day on a 20 000 L tank; 2600 L drawn off on day 9.5 (the day-10 dip is low), a
    // truck of 9000 L on day 11 (no dip that day), then dips on day 12 and a few hours later.
    const plan = {
      start: 15_000,
      at: [...every(1, 0, 10), 12, 12.1, ...every(1, 13, 20)],
      rate: () => 900,
      shifts: [
        { day: 9.5, volume: -2600 },
        { day: 11, volume: 9000 },
      ],
      noise: 100,
      quantum: 200,
    };
    const { events } = analyzeSeries(dips(plan), [], { capacity: 20_000 });
    const delivery = events.find((e) => e.type === 'delivery')!;
    expect(delivery.start).toBeGreaterThan(10 * DAY);
    expect(delivery.start).toBeLessThanOrEqual(12 * DAY);
  });
});

/**
 * A 1000 L tank dipped every 2.33 days at 33 L/day, then 110 L/day from day 30; a truck fills it to 850 L a
 * day after it falls below 300 L, so from day 30 nearly every other interval holds a delivery.
 */
function tripledUse() {
  const rate = (day: number) => (day < 30 ? 33 : 110);
  const shifts: { day: number; volume: number }[] = [];
  let level = 900;
  let due: number | null = null;
  for (let step = 1; step <= 7000; step++) {
    const day = step / 100;
    level -= rate(day) / 100;
    if (due === null && level < 300) due = day + 1;
    if (due !== null && day >= due) {
      shifts.push({ day, volume: 850 - level });
      level = 850;
      due = null;
    }
  }
  const at = Array.from({ length: 30 }, (_, k) => Math.round(k * 233) / 100);
  const plan = { start: 900, at, rate, shifts, noise: 3, quantum: 10.6 };
  return { plan, shifts, at, ...analyzeSeries(dips(plan), [], { capacity: 1000 }) };
}

describe('a change of use on manual dips', () => {
  it('is learnt from the drops between dips when deliveries keep cutting them', () => {
    const { shifts, at, events, points } = tripledUse();
    for (const p of points.filter((x) => x.time >= 45 * DAY)) expect(Math.abs(p.rate - 110)).toBeLessThan(16);
    // Every truck from day 40 that a dip can show (the last one comes after the last dip) is one event.
    const trucks = shifts.filter((x) => x.day > 40 && x.day < at[at.length - 1]!);
    const found = events.filter((e) => e.type === 'delivery' && e.start > 40 * DAY);
    expect(found).toHaveLength(trucks.length);
    for (const [k, t] of trucks.entries()) {
      expect(Math.abs(found[k]!.start - t.day * DAY)).toBeLessThan(2.33 * DAY);
    }
  });
});

describe('a rise after a low dip', () => {
  it('is a delivery at once, so a next dip near the old line does not take both for typos', () => {
    // In the tank above, the day-32.6 dip is low (the new use, not yet learnt), the day-35 dip shows the
    // truck of day 32.75 above the last trusted dip, and the day-37.3 dip falls back near the old line.
    const { shifts, events } = tripledUse();
    const truck = shifts.find((x) => x.day > 32 && x.day < 33)!;
    const found = events.filter(
      (e) => e.type === 'delivery' && Math.abs(e.start - truck.day * DAY) < 2.33 * DAY,
    );
    expect(found).toHaveLength(1);
  });
});

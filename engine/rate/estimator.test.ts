import { describe, expect, it } from 'vitest';
import { normals } from '../../test/support/normals.js';
import { analyzeSeries, createRateEstimator, type TimedVolume } from './index.js';

const DAY = 86_400_000;
const HOUR = 3_600_000;

interface Plan {
  start: number;
  step: number;
  days: number;
  rate: (t: number) => number;
  shifts?: { at: number; volume: number }[];
  noise?: number;
  seed?: number;
}

/** True volume falls at `rate` L/day, jumps by each shift; readings add Gaussian noise. */
function series(plan: Plan): TimedVolume[] {
  const gauss = normals(plan.seed ?? 7);
  const out: TimedVolume[] = [];
  let v = plan.start;
  const shifts = [...(plan.shifts ?? [])];
  for (let t = 0; t <= plan.days * DAY; t += plan.step) {
    if (t > 0) v -= (plan.rate(t) * plan.step) / DAY;
    while (shifts.length > 0 && shifts[0]!.at <= t) v += shifts.shift()!.volume;
    out.push({ time: t, volume: v + (plan.noise ?? 0) * gauss() });
  }
  return out;
}

/**
 * 300 L/day over the week, three quarters of it in working hours (08-17) and a quarter less at weekends (the
 * last two days of each week from t = 0).
 */
function workWeekUse(t: number): number {
  const weekMean = (5 + 2 * 0.75) / 7;
  const hour = (t % DAY) / HOUR;
  const weekend = Math.floor(t / DAY) % 7 >= 5 ? 0.75 : 1;
  return (300 * (hour >= 8 && hour < 17 ? (0.75 * 24) / 9 : (0.25 * 24) / 15) * weekend) / weekMean;
}

describe('rate estimator on a steady dense series', () => {
  const readings = series({ start: 9000, step: HOUR, days: 10, rate: () => 300, noise: 20 });
  const { points, events, suspects } = analyzeSeries(readings, [], { capacity: 10_000 });

  it('finds the consumption rate within 3% once a few days are in', () => {
    for (const p of points.slice(5 * 24)) expect(Math.abs(p.rate - 300) / 300).toBeLessThan(0.03);
  });

  it('reports no events or suspects in clean steady use', () => {
    expect(events).toEqual([]);
    expect(suspects).toEqual([]);
  });

  it('gives a range around the rate, and says what it rests on', () => {
    const last = points[points.length - 1]!;
    expect(last.rateLow).toBeLessThan(last.rate);
    expect(last.rateHigh).toBeGreaterThan(last.rate);
    expect(last.readings).toBe(readings.length);
    expect(last.basisDays).toBeCloseTo(10, 6);
  });
});

describe('events', () => {
  it('finds an unlogged delivery in dense data with its time and size', () => {
    const readings = series({
      start: 5000,
      step: HOUR,
      days: 8,
      rate: () => 300,
      noise: 15,
      shifts: [{ at: 4 * DAY + 0.5 * HOUR, volume: 4000 }],
    });
    const { events, points } = analyzeSeries(readings, [], { capacity: 10_000 });
    expect(events).toHaveLength(1);
    const [delivery] = events;
    expect(delivery!.type).toBe('delivery');
    expect(delivery!.logged).toBe(false);
    expect(Math.abs(delivery!.start - 4 * DAY)).toBeLessThanOrEqual(2 * HOUR);
    expect(Math.abs(delivery!.volume - 4000)).toBeLessThan(120);
    // The rate carries on through the delivery: the delivery is an event, not use.
    expect(Math.abs(points[points.length - 1]!.rate - 300) / 300).toBeLessThan(0.05);
  });

  it('merges a logged delivery with the one seen in the data', () => {
    const readings = series({
      start: 5000,
      step: HOUR,
      days: 8,
      rate: () => 300,
      noise: 15,
      shifts: [{ at: 4 * DAY + 0.5 * HOUR, volume: 4000 }],
    });
    const { events } = analyzeSeries(readings, [{ time: 4 * DAY + 3 * HOUR, volume: 3900 }], {
      capacity: 10_000,
    });
    expect(events).toHaveLength(1);
    expect(events[0]!.logged).toBe(true);
  });

  it('finds a bulk withdrawal on manual daily readings after the next reading confirms it', () => {
    const readings = series({
      start: 9000,
      step: DAY,
      days: 20,
      rate: () => 200,
      noise: 10,
      shifts: [{ at: 10 * DAY, volume: -1500 }],
    });
    const { events, suspects } = analyzeSeries(readings, [], { capacity: 10_000 });
    expect(events.map((e) => e.type)).toEqual(['withdrawal']);
    expect(Math.abs(events[0]!.volume - 1500)).toBeLessThan(100);
    expect(suspects).toEqual([]);
  });

  it('sees a pick-up on a filling tank and a negative rate', () => {
    const readings = series({
      start: 1000,
      step: 2 * HOUR,
      days: 12,
      rate: () => -400,
      noise: 10,
      shifts: [{ at: 8 * DAY, volume: -3500 }],
    });
    const { events, points } = analyzeSeries(readings, [], { capacity: 8000, filling: true });
    expect(events.map((e) => e.type)).toEqual(['pickup']);
    expect(points[points.length - 1]!.rate).toBeLessThan(-380);
  });
});

describe('suspect readings', () => {
  it('flags a one-reading spike, and the point at the spike does not jump', () => {
    const readings = series({ start: 9000, step: HOUR, days: 6, rate: () => 300, noise: 15 });
    const spikeAt = 100;
    readings[spikeAt] = { ...readings[spikeAt]!, volume: readings[spikeAt]!.volume + 2500 };
    const { points, events, suspects } = analyzeSeries(readings, [], { capacity: 10_000 });
    expect(events).toEqual([]);
    expect(suspects.map((s) => s.time)).toEqual([readings[spikeAt]!.time]);
    const before = points[spikeAt - 1]!;
    const at = points[spikeAt]!;
    expect(at.suspect).toMatch(/above the expected/);
    expect(at.rate).toBe(before.rate);
    expect(Math.abs(at.volume - (before.volume - 300 / 24))).toBeLessThan(5);
  });

  it('flags a typed-wrong manual reading that the next reading contradicts, with no event', () => {
    const readings = series({ start: 9000, step: DAY, days: 20, rate: () => 200, noise: 10 });
    readings[8] = { ...readings[8]!, volume: readings[8]!.volume * 0.4 };
    const { events, suspects } = analyzeSeries(readings, [], { capacity: 10_000 });
    expect(events).toEqual([]);
    expect(suspects).toHaveLength(1);
  });

  it('flags a manual typo that looks like a delivery and takes the event back', () => {
    const readings = series({ start: 4000, step: DAY, days: 15, rate: () => 200, noise: 10 });
    readings[8] = { ...readings[8]!, volume: readings[8]!.volume + 3000 };
    const { events, suspects, points } = analyzeSeries(readings, [], { capacity: 10_000 });
    expect(events).toEqual([]);
    expect(suspects.map((s) => s.time)).toEqual([readings[8]!.time]);
    expect(Math.abs(points[points.length - 1]!.rate - 200)).toBeLessThan(20);
  });

  it('names a likely unit slip', () => {
    const readings = series({ start: 9000, step: DAY, days: 12, rate: () => 200, noise: 5 });
    readings[6] = { ...readings[6]!, volume: readings[6]!.volume / 2.54 };
    const { suspects } = analyzeSeries(readings, [], { capacity: 10_000 });
    expect(suspects[0]?.reason).toMatch(/centimetres typed for inches/);
  });

  it('refuses impossible readings with a reason and keeps its state', () => {
    const clean = series({ start: 9000, step: HOUR, days: 3, rate: () => 300, noise: 10 });
    const estimator = createRateEstimator({ capacity: 10_000 });
    const reference = createRateEstimator({ capacity: 10_000 });
    clean.slice(0, 40).forEach((r) => {
      estimator.addReading(r.time, r.volume);
      reference.addReading(r.time, r.volume);
    });
    const bad: [number, number, RegExp][] = [
      [clean[40]!.time, Number.NaN, /not a number/],
      [clean[40]!.time, -5, /below zero/],
      [clean[40]!.time, 25_000, /above the tank capacity/],
      [clean[40]!.time, 1e300, /larger than any tank/],
      [clean[10]!.time, 8000, /earlier/],
      [Number.NaN, 8000, /not a valid instant/],
    ];
    for (const [time, volume, reason] of bad)
      expect(estimator.addReading(time, volume).suspect).toMatch(reason);
    const a = estimator.addReading(clean[40]!.time, clean[40]!.volume);
    const b = reference.addReading(clean[40]!.time, clean[40]!.volume);
    expect(a).toEqual(b);
  });

  it('gives a first-reading rejection a point that says nothing is known', () => {
    const p = createRateEstimator().addReading(0, Number.POSITIVE_INFINITY);
    expect(p.readings).toBe(0);
    expect(p.suspect).toBeDefined();
  });
});

describe('rate changes', () => {
  it('re-learns a tripled rate within a day at hourly sampling and reports the change', () => {
    const change = 8 * DAY;
    const readings = series({
      start: 9500,
      step: HOUR,
      days: 14,
      rate: (t) => (t <= change ? 150 : 450),
      noise: 10,
    });
    const { points, changes } = analyzeSeries(readings, [], { capacity: 10_000 });
    const after = points.filter((p) => p.time >= change + DAY);
    for (const p of after) expect(Math.abs(p.rate - 450) / 450).toBeLessThan(0.2);
    expect(changes.length).toBeGreaterThanOrEqual(1);
    expect(Math.abs(changes[0]!.at - change)).toBeLessThan(DAY);
    expect(changes[0]!.from).toBeLessThan(200);
    expect(changes[0]!.to).toBeGreaterThan(300);
  });
});

// The failing pattern behind the hourly adaptation lag (issue 3): three quarters of the use in working hours
// (08-17 UTC), so the daily profile learnt before a change is the wrong size after it. Lag as the accuracy
// bench counts it: hours from the change until the rate is within 20% and stays there a day.
describe('rate changes under a working-hour shape', () => {
  const lagOf = (factor: number, changeHour: number, seed: number, share: number, thermal: number) => {
    const change = 12 * DAY + changeHour * HOUR;
    const shape = (t: number) => {
      const hour = (t % DAY) / HOUR;
      if (share === 0) return 1;
      return hour >= 8 && hour < 17 ? (share * 24) / 9 : ((1 - share) * 24) / 15;
    };
    const readings = series({
      start: 9500,
      step: HOUR,
      days: 20,
      rate: (t) => (t <= change ? 200 : 200 * factor) * shape(t),
      noise: 20,
      seed,
    }).map((r) => ({ time: r.time, volume: r.volume + thermal * Math.sin((2 * Math.PI * r.time) / DAY) }));
    const after = analyzeSeries(readings, [], { capacity: 10_000 }).points.filter((p) => p.time >= change);
    const within = after.map((p) => Math.abs(p.rate - 200 * factor) <= 0.2 * 200 * factor);
    for (let i = 0; i < after.length; i++) {
      let j = i;
      while (j < after.length && after[j]!.time <= after[i]!.time + DAY && within[j]) j++;
      if (j === after.length || after[j]!.time > after[i]!.time + DAY)
        return (after[i]!.time - change) / HOUR;
    }
    return Number.POSITIVE_INFINITY;
  };
  /** Lags of one pattern over changes at night, mid-morning and evening, three noise seeds each, sorted. */
  const lags = (factor: number, share: number, thermal = 0) =>
    [2, 10, 18]
      .flatMap((hour) => [1, 2, 3].map((seed) => lagOf(factor, hour, seed, share, thermal)))
      .sort((a, b) => a - b);

  // Before the profile's use part scaled with the rate these were a median of 24 h (worst 32 h) and 25 h.
  it('re-learns a tripled rate within 20 h (median; within 30 h at worst)', () => {
    const l = lags(3, 0.75);
    expect(l[4]).toBeLessThanOrEqual(20);
    expect(l[8]).toBeLessThanOrEqual(30);
  });

  it('re-learns a tripled rate within 18 h (median) with a thermal swing on top', () => {
    expect(lags(3, 0.75, 30)[4]).toBeLessThanOrEqual(18);
  });

  // The slope check (slope-check.ts): 36 h here before it.
  it('follows use falling to 0.4 within 26 h (median) under working hours and a thermal swing', () => {
    expect(lags(0.4, 0.75, 30)[4]).toBeLessThanOrEqual(26);
  });

  it('keeps a lighter weekend under working hours from swinging the rate', () => {
    // 300 L/day over the week, a quarter less at weekends; a delivery mid-way. Windows of 12 or 18 hours let
    // the slope check take a night or a weekend for a change: the rate then fell to 69-94 L/day on these seeds.
    for (const seed of [1, 2, 3, 4, 5]) {
      const shifts = [{ at: 14 * DAY, volume: 4000 }];
      const readings = series({
        start: 9500,
        step: HOUR,
        days: 28,
        rate: workWeekUse,
        noise: 30,
        seed,
        shifts,
      });
      const later = analyzeSeries(readings, [], { capacity: 10_000 }).points.filter((p) => p.time >= 7 * DAY);
      expect(Math.min(...later.map((p) => p.rate))).toBeGreaterThan(135);
    }
  });

  it('still re-learns a tripled flat use under a thermal swing within 14 h (median)', () => {
    expect(lags(3, 0, 30)[4]).toBeLessThanOrEqual(14);
  });
});

describe('analyzeSeries input order', () => {
  it('gives the same result for readings and deliveries in any order', () => {
    const readings = series({ start: 5000, step: 6 * HOUR, days: 20, rate: () => 250, noise: 10 });
    const deliveries = [
      { time: 12 * DAY, volume: 300 },
      { time: 4 * DAY, volume: 200 },
    ];
    const sorted = analyzeSeries(readings, [...deliveries].reverse(), { capacity: 10_000 });
    const shuffled = analyzeSeries([...readings].reverse(), deliveries, { capacity: 10_000 });
    expect(shuffled).toEqual(sorted);
    expect(sorted.events.filter((e) => e.logged)).toHaveLength(2);
  });
});

// Patterns that failed on accuracy-bench scenarios generated with other seeds (bench/accuracy, invented tanks).
describe('shift cases from held-out scenario seeds', () => {
  /** 20 days of 6-hourly readings at `rate` L/day on a 10 000 L tank, with `shifts`, optionally one spike. */
  const sixHourly = (
    start: number,
    rate: number,
    shifts: Plan['shifts'],
    spike?: { at: number; by: number },
  ) => {
    const readings = series({ start, step: 6 * HOUR, days: 20, rate: () => rate, noise: 10, shifts });
    if (spike) readings.find((r) => r.time === spike.at)!.volume += spike.by;
    return { readings, ...analyzeSeries(readings, [], { capacity: 10_000 }) };
  };
  /** One event of `type` and about `volume` litres, and afterwards the rate within 10% of `rate`. */
  const expectOne = (result: ReturnType<typeof sixHourly>, type: string, volume: number, rate: number) => {
    expect(result.events.map((e) => e.type)).toEqual([type]);
    expect(Math.abs(result.events[0]!.volume - volume)).toBeLessThan(100);
    for (const p of result.points.filter((x) => x.time > 11 * DAY))
      expect(Math.abs(p.rate - rate) / rate).toBeLessThan(0.1);
  };

  it('counts a delivery a 6-hourly reading fell in the middle of as one event', () => {
    const halves = [
      { at: 10 * DAY - HOUR, volume: 2500 },
      { at: 10 * DAY + HOUR, volume: 2500 },
    ];
    expectOne(sixHourly(3000, 300, halves), 'delivery', 5000, 300);
  });

  it('counts a spike just before a delivery and the delivery as one event', () => {
    const result = sixHourly(3000, 300, [{ at: 10 * DAY + 3 * HOUR, volume: 5000 }], {
      at: 10 * DAY,
      by: 1500,
    });
    expectOne(result, 'delivery', 5000, 300);
    expect(Math.abs(result.events[0]!.start - 10 * DAY)).toBeLessThanOrEqual(6 * HOUR);
  });

  it('counts a withdrawal a 6-hourly reading fell in the middle of as one, not as a faster rate', () => {
    const halves = [
      { at: 10 * DAY - HOUR, volume: -350 },
      { at: 10 * DAY + HOUR, volume: -350 },
    ];
    expectOne(sixHourly(9000, 400, halves), 'withdrawal', 700, 400);
  });

  it('counts a withdrawal followed by a low spike as a withdrawal and a suspect reading', () => {
    const spike = { at: 10 * DAY + 6 * HOUR, by: -1500 };
    const result = sixHourly(9000, 400, [{ at: 10 * DAY - 2 * HOUR, volume: -700 }], spike);
    expectOne(result, 'withdrawal', 700, 400);
    expect(result.suspects.map((x) => x.time)).toContain(spike.at);
  });

  it('takes a delivery inside the first interval of twice-weekly dips as a delivery, not a filling rate', () => {
    const readings = series({
      start: 6000,
      step: 3.5 * DAY,
      days: 40,
      rate: () => 900,
      shifts: [{ at: 1.5 * DAY, volume: 12_000 }],
    });
    const { events, points } = analyzeSeries(readings, [], { capacity: 20_000 });
    expect(events.map((e) => e.type)).toEqual(['delivery']);
    for (const p of points.slice(3)) expect(p.rate).toBeGreaterThan(0);
    expect(Math.abs(points[points.length - 1]!.rate - 900) / 900).toBeLessThan(0.05);
  });

  it('keeps deliveries in consecutive dip intervals apart when together they are more than the tank holds', () => {
    // 7% of the tank a day, dips every 2.3 days; one delivery seen at the 25.3-day dip, the next at 27.6.
    const readings = series({
      start: 19_500,
      step: 2.3 * DAY,
      days: 38,
      rate: () => 1400,
      shifts: [
        { at: 12.5 * DAY, volume: 14_000 },
        { at: 23.5 * DAY, volume: 10_500 },
        { at: 25.8 * DAY, volume: 12_000 },
      ],
    });
    const { events } = analyzeSeries(readings, [], { capacity: 20_000 });
    expect(events.map((e) => e.type)).toEqual(['delivery', 'delivery', 'delivery']);
  });

  it('takes each dip above the last one as a delivery after use on twice-weekly dips triples', () => {
    // 1000 L/day for four weeks, then 3000 L/day with a delivery in every interval: the dips go 1000 L,
    // 3500 L, 1000 L, ... A rise of an eighth of the tank is a delivery, whatever the filter's noise says.
    const shifts = [{ at: 13 * DAY, volume: 11_000 }];
    for (let k = 0; k < 10; k++) shifts.push({ at: (30 + 3.5 * k) * DAY, volume: k % 2 ? 8000 : 13_000 });
    const readings = series({
      start: 18_000,
      step: 3.5 * DAY,
      days: 66,
      rate: (t) => (t <= 28 * DAY ? 1000 : 3000),
      shifts,
    });
    const { events } = analyzeSeries(readings, [], { capacity: 20_000 });
    const rises = readings.filter((r, i) => i > 0 && r.volume > readings[i - 1]!.volume).map((r) => r.time);
    expect(rises).toHaveLength(6);
    expect(events.map((e) => e.type)).toEqual(rises.map(() => 'delivery'));
    expect(events.map((e) => e.end)).toEqual(rises);
  });

  it('learns slower use on daily dips as a rate change, not as a run of small deliveries', () => {
    // 35 L/day on a 1000 L tank, then 11 L/day from day 20: each dip is above the prediction, none above
    // the dip before.
    const readings = series({
      start: 950,
      step: DAY,
      days: 40,
      rate: (t) => (t <= 20 * DAY ? 35 : 11),
      noise: 2,
    });
    const { events, points } = analyzeSeries(readings, [], { capacity: 1000 });
    expect(events).toEqual([]);
    expect(Math.abs(points[points.length - 1]!.rate - 11)).toBeLessThan(2);
  });

  it('sees no rise while a tank that ran dry reads empty, only the delivery after it', () => {
    for (const step of [HOUR, 6 * HOUR]) {
      const readings = series({
        start: 2000,
        step,
        days: 12,
        rate: () => 500,
        noise: 5,
        shifts: [{ at: 7 * DAY + 0.5 * HOUR, volume: 9000 }],
      }).map((r) => ({ time: r.time, volume: Math.max(0, r.time < 7 * DAY ? r.volume : r.volume + 1500) }));
      const { events } = analyzeSeries(readings, [], { capacity: 10_000 });
      expect(events.map((e) => e.type)).toEqual(['delivery']);
      expect(Math.abs(events[0]!.start - 7 * DAY)).toBeLessThanOrEqual(step);
    }
  });
});

describe('rate range on correlated dense readings', () => {
  // A daily thermal swing on top of workWeekUse: readings minutes apart share these deviations, so more of
  // them are not more news.
  const coverage = (step: number) => {
    const readings = series({ start: 9500, step, days: 30, rate: workWeekUse, noise: 50, seed: 3 }).map(
      (r) => ({
        time: r.time,
        volume: r.volume + 30 * Math.sin((2 * Math.PI * r.time) / DAY),
      }),
    );
    const later = analyzeSeries(readings, [], { capacity: 10_000 }).points.filter((p) => p.time >= 5 * DAY);
    return later.filter((p) => p.rateLow <= 300 && 300 <= p.rateHigh).length / later.length;
  };

  it('covers the mean rate at 5-minute sampling about as often as at hourly sampling', () => {
    const fast = coverage(5 * 60_000);
    const hourly = coverage(HOUR);
    expect(fast).toBeGreaterThanOrEqual(0.7);
    expect(fast).toBeGreaterThanOrEqual(hourly - 0.1);
  });
});

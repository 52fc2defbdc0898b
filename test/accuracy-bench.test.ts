// The accuracy bench's own yardsticks: the baselines recover an exact line, events match within the
// tolerance, and the generator's truth agrees with its readings.
import { describe, expect, it } from 'vitest';
import { leastSquaresBaseline } from '../bench/accuracy/baselines.js';
import { unseeable } from '../bench/accuracy/manual-seeds.js';
import { median, scenarioMetrics, startTolerance } from '../bench/accuracy/metrics.js';
import { accuracySuite } from '../bench/accuracy/suite.js';

const DAY = 86_400_000;

describe('least-squares baselines', () => {
  it('recover the slope of an exact line, and take out a rise only when asked', () => {
    const readings = Array.from({ length: 48 }, (_, i) => ({
      time: i * (DAY / 4),
      volume: 5000 - 25 * i + (i >= 24 ? 3000 : 0),
    }));
    const plain = leastSquaresBaseline(readings, 10_000, false);
    const cleaned = leastSquaresBaseline(readings, 10_000, true);
    // 25 L every 6 h is 100 L/day; before the rise both agree exactly.
    expect(plain.points[20]!.rate).toBeCloseTo(100, 9);
    expect(cleaned.points[20]!.rate).toBeCloseTo(100, 9);
    // After the rise the raw slope turns negative; the cleaned one stays near 100 (the 25 L used in the
    // interval of the rise goes out with the rise, so it is a little low while that interval is in the window).
    expect(plain.points[30]!.rate).toBeLessThan(0);
    expect(cleaned.points[40]!.rate).toBeGreaterThan(90);
    expect(cleaned.points[40]!.rate).toBeLessThan(100);
    expect(cleaned.events).toEqual([
      { type: 'delivery', start: 23 * (DAY / 4), end: 24 * (DAY / 4), volume: 2975 },
    ]);
  });
});

describe('metrics and scenarios', () => {
  const [scenario] = accuracySuite({ dense: 1, manual: 0, filling: 0, hard: 0 }, 99);

  it('gives the truth a perfect score against itself', () => {
    const s = scenario!;
    const points = s.readings.map((r) => {
      const rate = s.truth.rateAt(r.time);
      return { time: r.time, volume: s.truth.volumeAt(r.time), rate, rateLow: rate - 1, rateHigh: rate + 1 };
    });
    const m = scenarioMetrics(s, { points, events: s.truth.events });
    expect(m.refill.fp + m.refill.fn + m.withdrawal.fp + m.withdrawal.fn).toBe(0);
    expect(median(m.rateErrors)).toBe(0);
    expect(m.rateCovered).toBe(1);
  });

  it('puts readings near the true volume (noise, swing and spikes aside)', () => {
    const s = scenario!;
    const errors = s.readings.map((r) => Math.abs(r.volume - s.truth.volumeAt(r.time)) / s.capacity);
    expect(median(errors)).toBeLessThan(0.02);
  });
});

describe('event start tolerance', () => {
  const HOUR = 3_600_000;
  const delivery = { type: 'delivery' as const, start: 10 * DAY, end: 10 * DAY + HOUR, volume: 5000 };

  it('is the usual one where readings are near the event', () => {
    const hourly = Array.from({ length: 24 * 20 }, (_, i) => i * HOUR);
    expect(startTolerance(hourly, delivery, 2 * HOUR)).toBe(2 * HOUR);
  });

  it('is half the gap around an event inside an outage, where no method can place it closer', () => {
    // Hourly readings with none from day 8 to day 12: the delivery at day 10 shows only as a step between.
    const times = Array.from({ length: 24 * 20 }, (_, i) => i * HOUR).filter(
      (t) => t <= 8 * DAY || t >= 12 * DAY,
    );
    expect(startTolerance(times, delivery, 2 * HOUR)).toBe(2 * DAY);
  });
});

describe('deliveries no reading can show', () => {
  it('counts unlogged ones after the last reading and all but one unlogged between two readings', () => {
    const [base] = accuracySuite({ dense: 0, manual: 1, filling: 0, hard: 0 }, 99);
    const delivery = (day: number) => ({
      type: 'delivery' as const,
      start: day * DAY,
      end: day * DAY + 3_600_000,
      volume: 500,
    });
    const scenario = {
      ...base!,
      readings: [0, 2, 4].map((day) => ({ time: day * DAY, volume: 800 })),
      // Days 1 and 1.5 share a gap but one is logged; days 2.5 and 3 share one with neither logged; day 5
      // comes after the last reading unlogged, day 6 logged.
      logged: [1.5, 6].map((day) => ({ time: day * DAY + 3_600_000, volume: 500 })),
      truth: { ...base!.truth, events: [1, 1.5, 2.5, 3, 5, 6].map(delivery) },
    };
    expect(unseeable(scenario)).toEqual({ afterLast: 1, beyondOneInAGap: 1 });
  });
});

import { DateTime } from 'luxon';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { addDigestTeam, recordingSink, type TempStore, tempStore } from '../../test/schedule/helpers.js';
import type { Store } from '../store/index.js';
import { digestFromStore } from './digest.js';
import { noticesFromStore } from './notices.js';
import { createScheduler } from './scheduler.js';

// Demo scenario of our own invention (Kestrel Valley Water Co-op).
const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const T0 = Date.parse('2026-06-01T05:00:00Z'); // 07:00 in Europe/Berlin (CEST)
const TEAM = 'console:kestrel';
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };
// A US gallon is exactly 231 in^3 (NIST Handbook 44, Appendix C; quoted from memory).
const CAPACITY = (Math.PI * 24 * 24 * 72) / 231;

/** A seeded pseudo-random generator (mulberry32) so the noisy series are the same on every run. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
  addDigestTeam(store, TEAM, 'Europe/Berlin', T0 - 30 * DAY, '07:00', [], 'ops');
});
afterEach(() => temp.cleanup());

function addTank(code: string, product: string, settings: Record<string, unknown> = {}) {
  return store.tanks.add(
    TEAM,
    { code, site: 'Mill Creek Lift Station', product, spec: drum, settings },
    'u1',
    T0 - 30 * DAY,
  ).id;
}

function read(tankId: number, time: number, gal: number) {
  store.readings.add(
    TEAM,
    {
      tankId,
      time,
      kind: 'volume',
      value: gal,
      unit: 'gal',
      rawText: `${gal.toFixed(1)} gal`,
      userId: 'sensor',
    },
    time,
  );
}

function schedulerFor(clock: { value: number }, staleDays = 3) {
  const sink = recordingSink(() => clock.value);
  const scheduler = createScheduler({
    store,
    deliver: sink.deliver,
    clock: () => clock.value,
    graceMinutes: 60,
    leaseTtlMs: 6 * HOUR,
    composeDigest: digestFromStore,
    claimNotices: noticesFromStore({ staleDays }),
  });
  return { scheduler, posted: sink.posted };
}

describe('threshold notices on a noisy sensor', () => {
  it('one notice per real crossing, none from noise, re-armed by a delivery', async () => {
    const hypo = addTank('HYPO', 'sodium hypochlorite 12.5%', {
      threshold: { percent: 20 },
      leadTimeDays: 2,
    });
    // A level sensor every 30 minutes with +-1.5% of capacity noise: 45% -> 12% over 6 days, an (unlogged)
    // delivery back to 80%, then 80% -> 12% over 7 days. The 20% threshold is crossed twice for real.
    const random = seeded(2026);
    const noise = () => (random() * 2 - 1) * 0.015 * CAPACITY;
    const series: [number, number][] = [];
    let t = T0 - 2 * DAY;
    const drain = (from: number, to: number, days: number) => {
      const steps = days * 48;
      for (let i = 0; i < steps; i++, t += HOUR / 2)
        series.push([t, (from + ((to - from) * i) / steps) * CAPACITY + noise()]);
    };
    drain(0.45, 0.12, 6);
    drain(0.8, 0.12, 7);
    const clock = { value: T0 };
    const { scheduler, posted } = schedulerFor(clock);
    let next = 0;
    for (let now = T0; now <= t; now += 2 * HOUR) {
      store.transaction(() => {
        for (; next < series.length && series[next]![0] <= now; next++)
          read(hypo, series[next]![0], series[next]![1]);
      });
      clock.value = now;
      await scheduler.tick(now);
    }
    const notices = posted.filter((p) => p.meta.kind === 'notice');
    const limit = notices.filter((p) => p.meta.key.includes(':limit:'));
    expect(limit).toHaveLength(2);
    expect(limit[0]!.replies[0]!.headline).toBe(
      'HYPO at Mill Creek Lift Station is at or below its threshold.',
    );
    // Hypochlorite: the chemical caution, deferring to local codes.
    expect(limit[0]!.replies[0]!.caution).toMatch(/never meet acids/);
    expect(limit[0]!.replies[0]!.caution).toMatch(/local codes/);
    expect(notices).toHaveLength(2);
    // Notices went to the team's channel, and every one was posted once.
    expect(new Set(notices.map((p) => p.meta.key)).size).toBe(notices.length);
    expect(notices.every((p) => p.channel === 'ops')).toBe(true);
  });

  it('a restart keeps the notice state: a tank still low is not announced again', async () => {
    const hypo = addTank('HYPO', 'sodium hypochlorite', { threshold: { percent: 20 } });
    const clock = { value: T0 };
    store.transaction(() => {
      for (let i = 0; i < 10; i++) read(hypo, T0 - (10 - i) * HOUR, (0.25 - i * 0.01) * CAPACITY);
    });
    const first = schedulerFor(clock);
    await first.scheduler.tick(T0);
    first.scheduler.release();
    read(hypo, T0 + HOUR, 0.14 * CAPACITY);
    const second = schedulerFor(clock);
    await second.scheduler.tick(T0 + 2 * HOUR);
    const limitNotices = (p: { meta: { key: string } }) => p.meta.key.includes(':limit:');
    expect(first.posted.filter(limitNotices)).toHaveLength(1);
    expect(second.posted.filter(limitNotices)).toHaveLength(0);
  });
});

describe('high-level notices for a filling tank', () => {
  it('a backwash tank rising past its safe fill gets one notice, with the overfill caution', async () => {
    const waste = addTank('BW1', 'filter backwash waste', { filling: true, safeFillPercent: 90 });
    const random = seeded(7);
    const clock = { value: T0 };
    const { scheduler, posted } = schedulerFor(clock);
    // Hourly sensor readings rising from 60% to 97% of capacity over four days, +-1% noise.
    for (let h = 0; h <= 96; h++) {
      const time = T0 - 2 * DAY + h * HOUR;
      read(waste, time, (0.6 + (0.37 * h) / 96 + (random() * 2 - 1) * 0.01) * CAPACITY);
      if (h % 3 === 0) {
        clock.value = time;
        await scheduler.tick(time);
      }
    }
    const notices = posted.filter((p) => p.meta.kind === 'notice');
    expect(notices).toHaveLength(1);
    const reply = notices[0]!.replies[0]!;
    expect(reply.headline).toBe('BW1 at Mill Creek Lift Station is at its high level: book a pick-up.');
    expect(reply.caution).toMatch(/Above the safe fill level/);
    expect(reply.caution).toMatch(/local codes/);
  });
});

describe('stale reminders', () => {
  it('one a day at most, after the morning, once a tank has had no reading for three days', async () => {
    const w1 = addTank('W1', 'potable water');
    store.transaction(() => {
      for (let i = 0; i < 5; i++) read(w1, T0 - (5 - i) * DAY, 400 - 5 * i);
    });
    const clock = { value: T0 };
    const { scheduler, posted } = schedulerFor(clock);
    for (let now = T0; now <= T0 + 5 * DAY; now += HOUR) {
      clock.value = now;
      await scheduler.tick(now);
    }
    const stale = posted.filter((p) => p.meta.kind === 'stale');
    const localDays = stale.map((p) =>
      DateTime.fromMillis(p.at, { zone: 'Europe/Berlin' }).toFormat('yyyy-MM-dd HH:mm'),
    );
    // Last reading 2026-05-31 07:00 local; stale from 06-03 07:00, then once each morning.
    expect(localDays).toEqual([
      '2026-06-03 07:00',
      '2026-06-04 07:00',
      '2026-06-05 07:00',
      '2026-06-06 07:00',
    ]);
    expect(stale[0]!.replies[0]!.headline).toMatch(/^W1 has had no reading for 3 days/);
  });
});

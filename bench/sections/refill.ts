// Throughput of the refill planner: one full plan (settings check, threshold at the service level, delivery
// calendar, quantity), beside one luxon zone conversion of the same instants timed in the same run (the plan
// makes a handful of those), and a site consolidation of 100 tanks beside sorting their order-by times.
import { DateTime } from 'luxon';
import { consolidateSite, planRefill, type RefillInput, type SitePlan } from '../../engine/refill/index.js';
import { type BenchSection, opsPerSecond } from '../harness.js';

const DAY_MS = 86_400_000;
const base = Date.UTC(2026, 11, 7, 14);
const zone = 'America/Chicago';

// Kestrel Valley Water Co-op, Ridge Pump Station (invented): the contract example's supplier terms.
const input: RefillInput = {
  now: base,
  lastReadingAt: base,
  volume: 1200,
  rate: 50,
  rateSigma: 4,
  capacity: 2000,
  settings: {
    threshold: { percent: 20 },
    leadTimeDays: 3,
    businessDays: true,
    orderCutoffHour: 12,
    deliveryWeekdays: [2, 4],
    minimumOrder: 100,
    orderIncrement: 50,
    timeZone: zone,
  },
};

function planAt(i: number, stepMs: number): number {
  const now = base + i * stepMs;
  const r = planRefill({ ...input, now, lastReadingAt: now });
  return r.ok ? (r.value.orderBy ?? 0) : 0;
}

function sitePlans(): SitePlan[] {
  return Array.from({ length: 100 }, (_, i) => {
    const r = planRefill({ ...input, volume: 800 + 10 * i });
    if (!r.ok) throw new Error(r.error);
    return {
      tankId: `tank-${i}`,
      product: i % 2 ? 'diesel' : 'caustic soda',
      site: `site-${i % 5}`,
      plan: r.value,
    };
  });
}

export const refillSection: BenchSection = {
  title: 'refill planner',
  async run() {
    const zoneConversion = opsPerSecond((i) =>
      DateTime.fromMillis(base + i * 3_600_000, { zone })
        .startOf('day')
        .toMillis(),
    );
    const hourly = opsPerSecond((i) => planAt(i % 24_000, 3_600_000));
    const daily = opsPerSecond((i) => planAt(i % 20_000, DAY_MS));
    const plans = sitePlans();
    const times = plans.map((p) => p.plan.orderBy ?? 0);
    const sortBaseline = opsPerSecond(() => [...times].sort((a, b) => a - b).length);
    const consolidate = opsPerSecond(() => consolidateSite(plans, 3).length);
    const baseline = { name: 'one luxon zone conversion (fromMillis + startOf day)', value: zoneConversion };
    return [
      { name: 'planRefill, a plan every hour (dates repeat)', value: hourly, unit: 'ops/s', baseline },
      {
        name: 'planRefill, a plan every day for 55 years (new dates)',
        value: daily,
        unit: 'ops/s',
        baseline,
      },
      {
        name: 'consolidateSite, 100 tanks at 5 sites, 2 products',
        value: consolidate,
        unit: 'ops/s',
        baseline: { name: 'sorting their 100 order-by times', value: sortBaseline },
      },
    ];
  },
};

// The scenario families of the accuracy bench: seeded, so every run and every engineer sees the same set.
import { type Random, seededRandom } from './random.js';
import { buildScenario, type Scenario, type ScenarioSpec } from './scenarios.js';

const MINUTE = 60_000;

function regimeChanges(rnd: Random, days: number): { day: number; factor: number }[] {
  const count = rnd.pick([1, 1, 2]);
  return Array.from({ length: count }, (_, i) => ({
    day: Math.round(((i + 1) * days) / (count + 1) + rnd.uniform(-5, 5)) + rnd.uniform(0, 1),
    factor: rnd.chance(0.5) ? rnd.uniform(0.3, 0.7) : rnd.uniform(1.5, 3.5),
  }));
}

function denseSpec(rnd: Random, filling: boolean): ScenarioSpec {
  const capacity = rnd.pick([2000, 10_000, 40_000]);
  const lasts = filling ? rnd.uniform(10, 30) : rnd.uniform(10, 40);
  return {
    family: filling ? 'filling' : 'dense',
    days: 90,
    capacity,
    filling,
    rate: ((filling ? -1 : 1) * capacity) / lasts,
    changes: regimeChanges(rnd, 90),
    withdrawalsPerMonth: filling ? 0 : rnd.uniform(0.5, 2),
    workHoursShare: rnd.chance(0.5) ? 0 : rnd.uniform(0.6, 0.85),
    weekendFactor: rnd.uniform(0.7, 1),
    sensor: {
      intervalMs: rnd.pick([5, 15, 60, 360]) * MINUTE,
      noise: rnd.uniform(0.001, 0.01),
      spikeRate: rnd.uniform(0.002, 0.01),
      thermal: rnd.uniform(0, 0.005),
      quantum: rnd.pick([0, 0.001]),
      outageDays: rnd.chance(0.3) ? rnd.uniform(1, 3) : 0,
    },
  };
}

function manualSpec(rnd: Random): ScenarioSpec {
  const capacity = rnd.pick([1000, 4000, 20_000]);
  return {
    family: 'manual',
    days: 150,
    capacity,
    filling: false,
    rate: capacity / rnd.uniform(20, 60),
    changes: regimeChanges(rnd, 150),
    withdrawalsPerMonth: rnd.uniform(0, 1),
    workHoursShare: rnd.uniform(0.5, 0.85),
    weekendFactor: rnd.uniform(0.7, 1),
    manual: {
      perWeek: rnd.pick([2, 3, 5, 7]),
      rounding: rnd.pick(['inch', 'percent'] as const),
      typoRate: rnd.uniform(0.01, 0.03),
      loggedShare: 0.5,
    },
  };
}

/** The hard set: slow use under heavy noise, a tripling right after a delivery, a withdrawal just after a
 * delivery, a week-long outage. */
function hardSpec(rnd: Random, kind: number): ScenarioSpec {
  const base = denseSpec(rnd, false);
  const sensor = { ...base.sensor!, intervalMs: 60 * MINUTE };
  base.family = 'hard';
  if (kind === 0)
    return { ...base, rate: base.capacity / 200, changes: [], sensor: { ...sensor, noise: 0.01 } };
  if (kind === 1) return { ...base, changes: [{ day: 30.02, factor: 3 }], extraDeliveries: [30], sensor };
  if (kind === 2) return { ...base, changes: [], extraDeliveries: [30], extraWithdrawals: [30.1], sensor };
  return { ...base, sensor: { ...sensor, outageDays: 7 } };
}

export const HARD_KINDS = ['slow-noisy', 'triple-after-delivery', 'withdrawal-after-delivery', 'week-outage'];

export function accuracySuite(
  perFamily = { dense: 24, manual: 24, filling: 8, hard: 8 },
  seed = 20261202,
): Scenario[] {
  const out: Scenario[] = [];
  for (let i = 0; i < perFamily.dense; i++) {
    out.push(buildScenario(`dense-${i}`, denseSpec(seededRandom(seed + i), false), seed + 1000 + i));
  }
  for (let i = 0; i < perFamily.manual; i++) {
    out.push(buildScenario(`manual-${i}`, manualSpec(seededRandom(seed + 2000 + i)), seed + 3000 + i));
  }
  for (let i = 0; i < perFamily.filling; i++) {
    out.push(buildScenario(`filling-${i}`, denseSpec(seededRandom(seed + 4000 + i), true), seed + 5000 + i));
  }
  for (let i = 0; i < perFamily.hard; i++) {
    const kind = i % HARD_KINDS.length;
    out.push(
      buildScenario(
        `hard-${HARD_KINDS[kind]}-${i}`,
        hardSpec(seededRandom(seed + 6000 + i), kind),
        seed + 7000 + i,
      ),
    );
  }
  return out;
}

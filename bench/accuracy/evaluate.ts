// Runs the estimator and the two baselines over a scenario suite and summarises each family.
import { analyzeSeries } from '../../engine/rate/index.js';
import { leastSquaresBaseline } from './baselines.js';
import {
  type FamilySummary,
  type MethodResult,
  type ScenarioMetrics,
  scenarioMetrics,
  summarise,
} from './metrics.js';
import type { Family, Scenario } from './scenarios.js';

export const METHODS = ['estimator', 'ls7', 'ls7-no-rises'] as const;
export type Method = (typeof METHODS)[number];

export function runMethod(method: Method, s: Scenario): MethodResult {
  if (method === 'estimator') {
    const a = analyzeSeries(s.readings, s.logged, { capacity: s.capacity, filling: s.filling });
    return { points: a.points, events: a.events };
  }
  return leastSquaresBaseline(s.readings, s.capacity, method === 'ls7-no-rises', s.filling);
}

export interface FamilyResult {
  family: Family;
  readings: number;
  /** Readings per second of the estimator over the whole family (batch). */
  throughput: number;
  byMethod: Record<Method, FamilySummary>;
  perScenario: { name: string; intervalMs: number; metrics: ScenarioMetrics }[];
}

export function evaluate(suite: Scenario[]): FamilyResult[] {
  const families = [...new Set(suite.map((s) => s.family))];
  return families.map((family) => {
    const scenarios = suite.filter((s) => s.family === family);
    const readings = scenarios.reduce((a, s) => a + s.readings.length, 0);
    // Best of 5 passes: one pass over a small family (the manual one: ~2,400 readings, a few ms) is mostly
    // warm-up and whatever else the shared machine runs.
    let best = Number.POSITIVE_INFINITY;
    for (let pass = 0; pass < 5; pass++) {
      const t0 = performance.now();
      for (const s of scenarios)
        analyzeSeries(s.readings, s.logged, { capacity: s.capacity, filling: s.filling });
      best = Math.min(best, performance.now() - t0);
    }
    const throughput = readings / (best / 1000);
    const byMethod = {} as Record<Method, FamilySummary>;
    let perScenario: FamilyResult['perScenario'] = [];
    for (const method of METHODS) {
      const metrics = scenarios.map((s) => scenarioMetrics(s, runMethod(method, s)));
      byMethod[method] = summarise(metrics);
      if (method === 'estimator')
        perScenario = scenarios.map((s, i) => ({
          name: s.name,
          intervalMs: s.intervalMs,
          metrics: metrics[i]!,
        }));
    }
    return { family, readings, throughput, byMethod, perScenario };
  });
}

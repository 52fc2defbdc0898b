// The adaptation lag on more dense scenarios, estimator only: the main suite times 7 to 9 rate changes
// per sampling interval, so its median moves by hours with one scenario; ten seeds time over 300 each.
import { runMethod } from './evaluate.js';
import { num } from './figures.js';
import { median, scenarioMetrics } from './metrics.js';
import { accuracySuite } from './suite.js';

/**
 * The first four checked the daily profile's use part (as totals, and the events of a few scenarios); all ten
 * were then used to choose the slope check's values (tuning.ts), so they are tuning seeds, not held out.
 */
export const MORE_SEEDS = [100777, 110777, 120777, 130777, 140777, 150777, 160777, 170777, 180777, 190777];
/** Held out from that tuning: run once, as totals, after the slope check's values were chosen. */
export const LAG_CHECK_SEEDS = [200777, 210777, 220777, 230777, 240777, 250777];
const DENSE_PER_SEED = 96;

export interface MoreSeedsLags {
  seeds: number[];
  scenarios: number;
  /** Lags (h) of every timed rate change, by sampling interval (ms). */
  byInterval: Map<number, number[]>;
}

export function moreSeedsLags(seeds = MORE_SEEDS): MoreSeedsLags {
  const byInterval = new Map<number, number[]>();
  let scenarios = 0;
  for (const seed of seeds) {
    for (const s of accuracySuite({ dense: DENSE_PER_SEED, manual: 0, filling: 0, hard: 0 }, seed)) {
      scenarios++;
      const lags = scenarioMetrics(s, runMethod('estimator', s)).lags;
      byInterval.set(s.intervalMs, [...(byInterval.get(s.intervalMs) ?? []), ...lags]);
    }
  }
  return { seeds, scenarios, byInterval };
}

/** Median lag at hourly sampling over all the seeds. */
export const hourlyLag = (m: MoreSeedsLags) => median(m.byInterval.get(3_600_000) ?? []);

export function moreSeedsSection(m: MoreSeedsLags, title: string, about: string): string[] {
  const rows = [...m.byInterval.keys()]
    .sort((a, b) => a - b)
    .map((ms) => {
      const lags = m.byInterval.get(ms)!;
      return `| ${(ms / 60_000).toFixed(0)} min | ${lags.length} | ${num(median(lags), 1)} | ${lags.length ? num(Math.max(...lags), 1) : 'n/a'} |`;
    });
  return [
    `## ${title}: dense lag (${m.scenarios} scenarios, seeds ${m.seeds.join(', ')})`,
    '',
    `The dense family generated with ${m.seeds.length} more seeds, ${DENSE_PER_SEED} scenarios each, estimator only`,
    `(bench/accuracy/more-seeds.ts): the medians here rest on over a hundred rate changes per sampling interval. ${about}`,
    '',
    '| sampling | rate changes timed | lag median (h) | lag worst (h) |',
    '|---|---|---|---|',
    ...rows,
    '',
  ];
}

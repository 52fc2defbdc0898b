// The goal metrics on the scenario suite generated again with other seeds. While the estimator was changed,
// the tuning seeds' failing scenarios were looked into (figures pooled over them, never one alone); the
// check seeds were seen only as totals (the manual-dip fixes: all five, as totals per commit).
import { runMethod } from './evaluate.js';
import { num, pct } from './figures.js';
import { missedGoals } from './goals.js';
import { type FamilySummary, scenarioMetrics, summarise } from './metrics.js';
import { accuracySuite } from './suite.js';

export const TUNING_SEEDS = [777, 31337, 4242, 2027, 99, 11, 8080];
export const CHECK_SEEDS = [12345, 555, 9001, 4321, 60606];

export interface SeedRow {
  seed: string;
  dense: FamilySummary;
  manual: FamilySummary;
}

/** Estimator-only summaries of the dense and manual families of the suite on `seed`. */
export function seedRow(seed: number): SeedRow {
  const suite = accuracySuite({ dense: 24, manual: 24, filling: 0, hard: 0 }, seed);
  const of = (family: string) =>
    summarise(
      suite.filter((s) => s.family === family).map((s) => scenarioMetrics(s, runMethod('estimator', s))),
    );
  return { seed: String(seed), dense: of('dense'), manual: of('manual') };
}

/** A markdown table: the goal metrics per seed and which goals each misses. */
export function otherSeedsTable(rows: SeedRow[]): string {
  const lines = rows.map(({ seed, dense: d, manual: m }) => {
    const missed = missedGoals(d, m).map((g) => g.label);
    return `| ${seed} | ${num(d.refillF1)} | ${num(d.withdrawalF1)} | ${pct(d.rateError)} | ${pct(d.runwayError)} | ${pct(d.rateCoverage)} | ${num(m.refillF1)} | ${pct(m.rateError)} | ${pct(m.rateCoverage)} | ${missed.join('; ') || 'none'} |`;
  });
  return [
    '| seed | dense delivery F1 | dense withdrawal F1 | dense rate error | dense runway error | dense rate coverage | manual delivery F1 | manual rate error | manual rate coverage | goals missed |',
    '|---|---|---|---|---|---|---|---|---|---|',
    ...lines,
  ].join('\n');
}

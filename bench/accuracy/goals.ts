// The accuracy goals as data, so the goals table and the other-seeds table judge by the same list.
import type { FamilySummary } from './metrics.js';

export interface Goal {
  label: string;
  family: 'dense' | 'manual';
  key: keyof FamilySummary;
  met: (x: number) => boolean;
}

const inBand = (x: number) => x >= 0.7 && x <= 0.9;

export const GOALS: readonly Goal[] = [
  { label: 'dense delivery F1 >= 0.97', family: 'dense', key: 'refillF1', met: (x) => x >= 0.97 },
  { label: 'dense withdrawal F1 >= 0.90', family: 'dense', key: 'withdrawalF1', met: (x) => x >= 0.9 },
  { label: 'dense rate error <= 5%', family: 'dense', key: 'rateError', met: (x) => x <= 0.05 },
  { label: 'dense runway error <= 6%', family: 'dense', key: 'runwayError', met: (x) => x <= 0.06 },
  { label: 'dense rate coverage 70-90%', family: 'dense', key: 'rateCoverage', met: inBand },
  { label: 'manual delivery F1 >= 0.95', family: 'manual', key: 'refillF1', met: (x) => x >= 0.95 },
  { label: 'manual rate error <= 10%', family: 'manual', key: 'rateError', met: (x) => x <= 0.1 },
  { label: 'manual rate coverage 70-90%', family: 'manual', key: 'rateCoverage', met: inBand },
];

/** Whether the goal on this family's metric is met ('yes' / 'no'), for the goals table. */
export function metText(family: Goal['family'], key: keyof FamilySummary, value: number): string {
  const goal = GOALS.find((g) => g.family === family && g.key === key);
  return goal?.met(value) ? 'yes' : 'no';
}

/** The goals a pair of family summaries misses. */
export function missedGoals(dense: FamilySummary, manual: FamilySummary): Goal[] {
  return GOALS.filter((g) => !g.met((g.family === 'dense' ? dense : manual)[g.key]));
}

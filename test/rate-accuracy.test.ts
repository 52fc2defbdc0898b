// Regression guard for the estimator's accuracy on a small seeded slice of the accuracy bench's scenarios
// (bench/accuracy: invented tanks with ground truth). The full figures are in docs/accuracy.md.
import { describe, expect, it } from 'vitest';
import { runMethod } from '../bench/accuracy/evaluate.js';
import { scenarioMetrics, summarise } from '../bench/accuracy/metrics.js';
import { accuracySuite } from '../bench/accuracy/suite.js';

const suite = accuracySuite({ dense: 4, manual: 6, filling: 2, hard: 4 }, 7_000_001);

function family(name: string, method: 'estimator' | 'ls7' | 'ls7-no-rises') {
  return summarise(
    suite.filter((s) => s.family === name).map((s) => scenarioMetrics(s, runMethod(method, s))),
  );
}

describe('estimator accuracy on seeded scenarios', () => {
  it('finds deliveries and the steady rate on dense sensor series', () => {
    const ours = family('dense', 'estimator');
    expect(ours.refillF1).toBeGreaterThanOrEqual(0.95);
    expect(ours.rateError).toBeLessThanOrEqual(0.05);
    expect(ours.runwayError).toBeLessThanOrEqual(0.06);
    const better = Math.min(family('dense', 'ls7').rateError, family('dense', 'ls7-no-rises').rateError);
    // On four scenarios only beating the better baseline is asserted; the one-third goal is measured on the
    // full suite (docs/accuracy.md), where a few slow, event-free tanks do not dominate the median.
    expect(ours.rateError).toBeLessThan(better);
  });

  it('finds deliveries and the rate on sparse manual readings with typos', () => {
    const ours = family('manual', 'estimator');
    expect(ours.refillF1).toBeGreaterThanOrEqual(0.9);
    expect(ours.rateError).toBeLessThanOrEqual(0.1);
    expect(ours.rateCoverage).toBeGreaterThan(0.6);
  });

  it('handles filling tanks and the hard set without losing the rate', () => {
    expect(family('filling', 'estimator').rateError).toBeLessThanOrEqual(0.06);
    const hard = family('hard', 'estimator');
    expect(hard.refillF1).toBeGreaterThanOrEqual(0.9);
    expect(hard.rateError).toBeLessThanOrEqual(0.08);
  });
});

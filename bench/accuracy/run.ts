// `npm run bench:accuracy`: runs the scenario suite with ground truth through the estimator and the two
// baselines, backtests the open real series, and writes docs/accuracy.md with plots in docs/accuracy/.
import { mkdirSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { machineNote } from '../harness.js';
import { evaluate, type FamilyResult, METHODS, runMethod } from './evaluate.js';
import { num, pct } from './figures.js';
import { metText } from './goals.js';
import { moreManualSeeds, moreManualSeedsMarkdown } from './manual-seeds.js';
import { type FamilySummary, median } from './metrics.js';
import {
  LAG_CHECK_SEEDS,
  hourlyLag as moreHourlyLag,
  moreSeedsLags,
  moreSeedsSection,
} from './more-seeds.js';
import { CHECK_SEEDS, otherSeedsTable, seedRow, TUNING_SEEDS } from './other-seeds.js';
import { lineChartPng, thin } from './plot.js';
import { backtestRainwater } from './real.js';
import { refillSimMarkdown, runRefillSimulation } from './refill-sim-report.js';
import type { Scenario } from './scenarios.js';
import { accuracySuite } from './suite.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const docs = `${root}docs`;
const DAY_MS = 86_400_000;

const ratio = (a: number, b: number) =>
  Number.isFinite(a) && Number.isFinite(b) && b > 0 ? `${(a / b).toFixed(2)}x` : 'n/a';

const ROWS: [keyof FamilySummary, string, (x: number) => string][] = [
  ['refillF1', 'delivery (pick-up) F1', (x) => num(x)],
  ['refillPrecision', 'delivery precision', (x) => num(x)],
  ['refillRecall', 'delivery recall', (x) => num(x)],
  ['withdrawalF1', 'withdrawal F1', (x) => num(x)],
  ['eventVolumeError', 'event volume error (median)', pct],
  ['rateError', 'rate error, steady points (median abs)', pct],
  ['runwayError', 'runway error (median abs)', pct],
  ['rateCoverage', 'rate ~80% range coverage', pct],
  ['runwayCoverage', 'runway ~80% range coverage', pct],
  ['lagMedianHours', 'adaptation lag, median (h)', (x) => num(x, 1)],
  ['lagWorstHours', 'adaptation lag, worst (h; 240 = not within 10 days)', (x) => num(x, 1)],
  ['dayUseLagMedianHours', "adaptation lag against the day's use, median (h; check)", (x) => num(x, 1)],
];

function familyTable(r: FamilyResult): string {
  const head = `| metric | estimator | 7-day LS slope | 7-day LS, rises removed | estimator error / LS | / LS no rises |\n|---|---|---|---|---|---|`;
  const lines = ROWS.map(([key, label, fmt]) => {
    const [e, a, b] = METHODS.map((m) => r.byMethod[m][key]) as [number, number, number];
    const isError = key === 'rateError' || key === 'runwayError' || key === 'eventVolumeError';
    return `| ${label} | ${fmt(e)} | ${fmt(a)} | ${fmt(b)} | ${isError ? ratio(e, a) : ''} | ${isError ? ratio(e, b) : ''} |`;
  });
  return [head, ...lines].join('\n');
}

/** Estimator rate error and adaptation lag per sampling interval (the lag goal is stated at hourly sampling). */
function byInterval(r: FamilyResult): string {
  const intervals = [...new Set(r.perScenario.map((p) => p.intervalMs))].sort((a, b) => a - b);
  const rows = intervals.map((ms) => {
    const group = r.perScenario.filter((p) => p.intervalMs === ms);
    const lags = group.flatMap((p) => p.metrics.lags);
    const errors = group.flatMap((p) => p.metrics.rateErrors);
    const label = ms < DAY_MS ? `${(ms / 60_000).toFixed(0)} min` : `${(ms / DAY_MS).toFixed(1)} days`;
    return `| ${label} | ${group.length} | ${pct(median(errors))} | ${lags.length} | ${num(median(lags), 1)} | ${lags.length ? num(Math.max(...lags), 1) : 'n/a'} |`;
  });
  return [
    '| sampling | scenarios | rate error (median) | rate changes timed | lag median (h) | lag worst (h) |',
    '|---|---|---|---|---|---|',
    ...rows,
  ].join('\n');
}

/** Lags of every rate change timed at hourly sampling (the interval the lag goal is stated at). */
const hourlyLags = (r: FamilyResult | undefined) =>
  (r?.perScenario ?? []).filter((p) => p.intervalMs === 3_600_000).flatMap((p) => p.metrics.lags);
/** Their median. */
const hourlyLagOf = (r: FamilyResult) => median(hourlyLags(r));

function hardBreakdown(r: FamilyResult): string {
  const rows = r.perScenario.map(({ name, metrics }) => {
    const med = [...metrics.rateErrors].sort((a, b) => a - b)[metrics.rateErrors.length >> 1] ?? Number.NaN;
    return `| ${name} | ${metrics.refill.tp}/${metrics.refill.tp + metrics.refill.fn} found, ${metrics.refill.fp} false | ${metrics.withdrawal.tp}/${metrics.withdrawal.tp + metrics.withdrawal.fn} found, ${metrics.withdrawal.fp} false | ${pct(med)} | ${metrics.lags.map((l) => l.toFixed(0)).join(', ') || '-'} |`;
  });
  return [
    '| scenario | deliveries | withdrawals | rate error | lags (h) |',
    '|---|---|---|---|---|',
    ...rows,
  ].join('\n');
}

async function plots(suite: Scenario[]): Promise<string[]> {
  mkdirSync(`${docs}/accuracy`, { recursive: true });
  const written: string[] = [];
  for (const name of ['dense-4', 'manual-0', 'hard-triple-after-delivery-1']) {
    const s = suite.find((x) => x.name === name);
    if (!s) continue;
    // From day 2: the first readings' ranges are wide enough to flatten the rest of the chart.
    const t0 = s.readings[0]!.time;
    const points = runMethod('estimator', s).points.filter((p) => p.time >= t0 + 2 * DAY_MS);
    const day = (t: number) => (t - t0) / DAY_MS;
    const baseline = runMethod('ls7-no-rises', s).points.filter((p) => p.time >= t0 + 2 * DAY_MS);
    const rate = await lineChartPng(`${name}: consumption rate`, 'day', 'L/day', [
      {
        name: 'true regime rate',
        points: thin(points).map((p) => ({ x: day(p.time), y: s.truth.rateAt(p.time) })),
      },
      { name: 'estimator', points: thin(points).map((p) => ({ x: day(p.time), y: p.rate })) },
      { name: 'estimator 80% low', points: thin(points).map((p) => ({ x: day(p.time), y: p.rateLow })) },
      { name: 'estimator 80% high', points: thin(points).map((p) => ({ x: day(p.time), y: p.rateHigh })) },
      { name: '7-day LS, rises removed', points: thin(baseline).map((p) => ({ x: day(p.time), y: p.rate })) },
    ]);
    const file = `accuracy/${name}-rate.png`;
    writeFileSync(`${docs}/${file}`, rate);
    written.push(file);
    const volume = await lineChartPng(`${name}: volume`, 'day', 'L', [
      { name: 'readings', points: thin(s.readings).map((r) => ({ x: day(r.time), y: r.volume })) },
      {
        name: 'true volume',
        points: thin(points).map((p) => ({ x: day(p.time), y: s.truth.volumeAt(p.time) })),
      },
      { name: 'filtered', points: thin(points).map((p) => ({ x: day(p.time), y: p.volume })) },
    ]);
    const vfile = `accuracy/${name}-volume.png`;
    writeFileSync(`${docs}/${vfile}`, volume);
    written.push(vfile);
  }
  return written;
}

/**
 * A larger dense set on another seed: the goals are judged on held-out scenarios "of the same kinds", and the
 * main suite times only a handful of rate changes per sampling interval. Its 24-scenario version (seed 777) was
 * among the seeds looked into while fixing event detection (Other seeds), and its rate changes were traced one
 * by one while the daily profile's use part was worked out (the share itself was chosen on pooled seeds).
 */
const HELD_OUT_SEED = 777;
const HELD_OUT_DENSE = 96;

function heldOutSection(r: FamilyResult): string[] {
  const e = r.byMethod.estimator;
  return [
    `## Held-out seed: dense (${e.scenarios} scenarios, seed ${HELD_OUT_SEED}, ${r.readings.toLocaleString('en-US')} readings)`,
    '',
    'The dense family generated again with another seed and four times the scenarios (accuracySuite parameters),',
    'so the lag per sampling interval rests on about 30 rate changes each instead of 7 to 9. Seed 777 was',
    'among those looked into while fixing event detection (Other seeds), and its rate changes were traced while',
    "the daily profile's use part was worked out; the first four of the more seeds below checked the result",
    '(as totals, and the events of a few scenarios after one showed a runaway rate).',
    '',
    `Delivery F1 ${num(e.refillF1)}, withdrawal F1 ${num(e.withdrawalF1)}, rate error ${pct(e.rateError)}, runway error ${pct(e.runwayError)}, rate / runway ~80% range coverage ${pct(e.rateCoverage)} / ${pct(e.runwayCoverage)}.`,
    '',
    byInterval(r),
    '',
  ];
}

const started = performance.now();
const suite = accuracySuite();
const results = evaluate(suite);
const heldOut = evaluate(
  accuracySuite({ dense: HELD_OUT_DENSE, manual: 0, filling: 0, hard: 0 }, HELD_OUT_SEED),
).find((r) => r.family === 'dense');
const more = moreSeedsLags();
const lagCheck = moreSeedsLags(LAG_CHECK_SEEDS);
const otherSeeds = [...TUNING_SEEDS, ...CHECK_SEEDS].map(seedRow);
const moreManual = moreManualSeeds();
// A checkout outside the folder that holds ../shared (a git worktree elsewhere) names the real data here.
const real = backtestRainwater(process.env.TANKRUNWAY_REAL_DATA ?? `${root}../shared/data/real`);
const images = await plots(suite);
const seconds = (performance.now() - started) / 1000;

const md: string[] = [
  '# Accuracy of the consumption-rate estimator',
  '',
  `Written by \`npm run bench:accuracy\` (bench/accuracy/run.ts) on ${machineNote()}; the whole run took ${seconds.toFixed(0)} s.`,
  'Scenarios are invented and seeded (bench/accuracy/suite.ts, scenarios.ts): every run sees the same set.',
  '',
  'Definitions: an event is found when a detected event of the same type starts within max(2 sampling',
  'intervals, 2 h) of the true start, or within half the gap between the readings around it when that is',
  'longer (an event inside a sensor outage can only be placed between them). Steady points are 2 days past',
  'the start and past a rate change and from 1 h before to 12 h after any event are left out. The true rate',
  'is the regime rate (the weekly mean, before working-hour and weekday shaping). The true runway is the true',
  'volume over the true rate (to empty;',
  'to full on filling tanks). Adaptation lag: hours after a change until the rate is within 20% and stays',
  'there a day. Baselines, computed in the same run: the least-squares slope of the raw readings over the last',
  '7 days, and the same after removing rises larger than 5% of capacity (drops on filling tanks).',
  '',
  'Check on the lag metric: its truth is the weekly mean, and weekends use up to a quarter less, so a faithful',
  'estimate can sit outside the 20% band on a weekend for reasons other than the change. The rows "against',
  "the day's use\" time the same lag against the regime rate times that day's weekday factor (the working-hour",
  'shape averages out within a day). It does not come out shorter (see the goals table), so the weekly-mean',
  'truth does not mask the lag; the goal is still judged on the original definition.',
  '',
];
for (const r of results) {
  md.push(
    `## ${r.family} (${r.byMethod.estimator.scenarios} scenarios, ${r.readings.toLocaleString('en-US')} readings)`,
  );
  md.push('');
  md.push(
    `Estimator throughput over this family (batch, one core, best of 5 passes in this run): ${Math.round(r.throughput).toLocaleString('en-US')} readings/s (includes the event and change logic; \`npm run bench\` times it against a bare Kalman loop).`,
  );
  md.push('');
  md.push(familyTable(r));
  md.push('');
  if (r.family !== 'manual') {
    md.push(byInterval(r));
    md.push('');
  }
  if (r.family === 'hard') {
    md.push(hardBreakdown(r));
    md.push('');
  }
}
if (heldOut) md.push(...heldOutSection(heldOut));
md.push(
  ...moreSeedsSection(
    more,
    'More seeds',
    "These are tuning seeds: the slope check's values were chosen on them (engine/rate/tuning.ts).",
  ),
);
md.push(
  ...moreSeedsSection(
    lagCheck,
    'Check seeds',
    'Held out from that tuning: first run once, as totals, after the values were chosen.',
  ),
);
md.push('## Goals from the issue, as measured here', '');
const dense = results.find((r) => r.family === 'dense')?.byMethod;
const manual = results.find((r) => r.family === 'manual')?.byMethod;
if (dense && manual) {
  const e = dense.estimator;
  const m = manual.estimator;
  const denseFamily = results.find((r) => r.family === 'dense')!;
  const hourlyLag = hourlyLagOf(denseFamily);
  const hourlyDayUseLag = median(
    denseFamily.perScenario.filter((p) => p.intervalMs === 3_600_000).flatMap((p) => p.metrics.dayUseLags),
  );
  const better = (f: typeof dense) => Math.min(f.ls7.rateError, f['ls7-no-rises'].rateError);
  // Every dense rate change the run timed at hourly sampling: the main suite, seed 777, the more and check seeds.
  const pooled = [
    ...hourlyLags(denseFamily),
    ...hourlyLags(heldOut),
    ...(more.byInterval.get(3_600_000) ?? []),
    ...(lagCheck.byInterval.get(3_600_000) ?? []),
  ];
  md.push(
    '| goal | measured | met |',
    '|---|---|---|',
    `| dense delivery F1 >= 0.97 | ${num(e.refillF1)} | ${metText('dense', 'refillF1', e.refillF1)} |`,
    `| dense withdrawal F1 >= 0.90 | ${num(e.withdrawalF1)} | ${metText('dense', 'withdrawalF1', e.withdrawalF1)} |`,
    `| dense rate error <= 5% | ${pct(e.rateError)} | ${metText('dense', 'rateError', e.rateError)} |`,
    `| dense runway error <= 6% | ${pct(e.runwayError)} | ${metText('dense', 'runwayError', e.runwayError)} |`,
    `| dense lag <= 24 h at hourly sampling (median) | ${num(hourlyLag, 1)} h | ${hourlyLag <= 24 ? 'yes' : 'no'} |`,
    `| (dense lag, median over all sampling rates) | ${num(e.lagMedianHours, 1)} h | |`,
    `| (check: dense lag at hourly sampling against the day's use) | ${num(hourlyDayUseLag, 1)} h | |`,
    `| (held-out seed ${HELD_OUT_SEED}: dense lag at hourly sampling, median) | ${heldOut ? num(hourlyLagOf(heldOut), 1) : 'n/a'} h | ${heldOut ? (hourlyLagOf(heldOut) <= 24 ? 'yes' : 'no') : ''} |`,
    `| (more seeds ${more.seeds.join(', ')}, used in tuning: dense lag at hourly sampling, median of ${more.byInterval.get(3_600_000)?.length ?? 0} changes) | ${num(moreHourlyLag(more), 1)} h | ${moreHourlyLag(more) <= 24 ? 'yes' : 'no'} |`,
    `| (check seeds ${lagCheck.seeds.join(', ')}, held out: dense lag at hourly sampling, median of ${lagCheck.byInterval.get(3_600_000)?.length ?? 0} changes) | ${num(moreHourlyLag(lagCheck), 1)} h | ${moreHourlyLag(lagCheck) <= 24 ? 'yes' : 'no'} |`,
    `| (all of the above pooled: dense lag at hourly sampling, median of ${pooled.length} changes) | ${num(median(pooled), 1)} h | ${median(pooled) <= 24 ? 'yes' : 'no'} |`,
    `| manual delivery F1 >= 0.95 | ${num(m.refillF1)} | ${metText('manual', 'refillF1', m.refillF1)} |`,
    `| manual rate error <= 10% | ${pct(m.rateError)} | ${metText('manual', 'rateError', m.rateError)} |`,
    `| range coverage 70-90% (dense rate / manual rate) | ${pct(e.rateCoverage)} / ${pct(m.rateCoverage)} | ${metText('dense', 'rateCoverage', e.rateCoverage) === 'yes' && metText('manual', 'rateCoverage', m.rateCoverage) === 'yes' ? 'yes' : 'no'} |`,
    `| rate error <= 1/3 of the better baseline (dense / manual) | ${ratio(e.rateError, better(dense))} / ${ratio(m.rateError, better(manual))} | ${e.rateError <= better(dense) / 3 && m.rateError <= better(manual) / 3 ? 'yes' : 'no'} |`,
    '',
  );
}
const mainDense = results.find((r) => r.family === 'dense')?.byMethod.estimator;
const mainManual = results.find((r) => r.family === 'manual')?.byMethod.estimator;
md.push(
  '## Other seeds',
  '',
  'The dense and manual families (24 scenarios each) generated again with other seeds, estimator only, judged',
  `by the goals above. The failing scenarios of seeds ${TUNING_SEEDS.join(', ')} were looked into while fixing the`,
  `estimator; seeds ${CHECK_SEEDS.join(', ')} were seen only as totals or not at all (bench/accuracy/other-seeds.ts).`,
  'The lag goal is left out here (see the held-out section).',
  '',
  otherSeedsTable([
    ...(mainDense && mainManual ? [{ seed: 'main', dense: mainDense, manual: mainManual }] : []),
    ...otherSeeds,
  ]),
  '',
);
md.push(...moreManualSeedsMarkdown(moreManual));
md.push('## Backtest on a real series', '');
if (real) {
  md.push(
    `${real.name} (${real.rows} rows; source and licence in ../shared/data/real/${real.name}/SOURCE.md; read at bench time, not copied).`,
    'The "realised" use is the logger\'s own cumulative withdrawal (field4), computed from level decreases, so',
    'sensor noise inflates it; read the figures as a comparison between methods, not as absolute truth.',
    '',
    '| method | rate vs use realised over the next 7 days (median abs, L/day) | run-out error 7 days ahead (median abs days) | 3 days ahead |',
    '|---|---|---|---|',
    ...Object.keys(real.rateError).map(
      (m) =>
        `| ${m} | ${num(real.rateError[m]!, 1)} | ${num(real.runout[0]!.medianAbsDays[m]!, 2)} | ${num(real.runout[1]!.medianAbsDays[m]!, 2)} |`,
    ),
    '',
    `Rate compared at ${real.rateCompared} readings; run-out forecasts: ${real.runout.map((r) => `${r.count} made ${r.ahead} days ahead`).join(', ')} (crossings of 1000 L with no rain between forecast and crossing; a forecast with no run-out counts as 3x the horizon).`,
    '',
  );
} else md.push('The real series folder was not found; no backtest this run.', '');
md.push(refillSimMarkdown(runRefillSimulation(suite)));
md.push('## Plots', '', ...images.map((f) => `![${f}](${f})`), '');
mkdirSync(docs, { recursive: true });
writeFileSync(`${docs}/accuracy.md`, md.join('\n'));
console.log(md.join('\n'));

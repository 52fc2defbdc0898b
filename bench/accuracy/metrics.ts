// Accuracy metrics of one method on one scenario, and their roll-up per family (definitions in the issue:
// event precision/recall/F1 with a start tolerance of max(2 sampling intervals, 2 h, half the reading gap around
// the event); rate and runway median absolute % error on steady points; adaptation lag; coverage of the ~80%
// ranges).
import { runwayTo } from '../../engine/forecast/runway.js';
import type { Scenario, TruthEvent, TruthEventType } from './scenarios.js';

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;

export interface MethodPoint {
  time: number;
  volume: number;
  rate: number;
  rateLow: number;
  rateHigh: number;
}
export interface MethodEvent {
  type: TruthEventType;
  start: number;
  end: number;
  volume: number;
}
export interface MethodResult {
  points: MethodPoint[];
  events: MethodEvent[];
}

export interface Counts {
  tp: number;
  fp: number;
  fn: number;
}

export interface ScenarioMetrics {
  refill: Counts;
  withdrawal: Counts;
  eventVolumeErrors: number[];
  rateErrors: number[];
  rateCovered: number;
  runwayErrors: number[];
  runwayCovered: number;
  /** Hours after each rate change until the rate is within 20% of the regime rate and stays there a day. */
  lags: number[];
  /** The same against the day's use (regime rate times the weekday factor; see Scenario.truth.dayUseAt). */
  dayUseLags: number[];
}

/**
 * The start tolerance of one true event: the usual one, or half the gap between the readings around the event
 * when that is longer (an event inside a sensor outage can only be placed somewhere between them).
 */
export function startTolerance(
  readingTimes: readonly number[],
  event: TruthEvent,
  toleranceMs: number,
): number {
  let lo = 0;
  let hi = readingTimes.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (readingTimes[mid]! <= event.start) lo = mid + 1;
    else hi = mid;
  }
  const before = readingTimes[lo - 1];
  let next = lo;
  while (next < readingTimes.length && readingTimes[next]! < event.end) next++;
  const after = readingTimes[next];
  if (before === undefined || after === undefined) return toleranceMs;
  return Math.max(toleranceMs, (after - before) / 2);
}

function matchEvents(
  truth: TruthEvent[],
  found: MethodEvent[],
  toleranceOf: (event: TruthEvent) => number,
  volumeErrors: number[],
): Counts {
  const used = new Set<number>();
  let tp = 0;
  for (const t of truth) {
    const toleranceMs = toleranceOf(t);
    let best = -1;
    let bestGap = Number.POSITIVE_INFINITY;
    found.forEach((f, i) => {
      const gap = Math.abs(f.start - t.start);
      if (!used.has(i) && gap <= toleranceMs && gap < bestGap) {
        best = i;
        bestGap = gap;
      }
    });
    if (best >= 0) {
      used.add(best);
      tp++;
      volumeErrors.push(Math.abs(found[best]!.volume - t.volume) / t.volume);
    }
  }
  return { tp, fp: found.length - tp, fn: truth.length - tp };
}

/** A point is steady 2 days after the start and after a rate change, and away from events. */
function isSteady(time: number, scenario: Scenario, start: number): boolean {
  if (time < start + 2 * DAY_MS) return false;
  for (const c of scenario.truth.changes) if (time >= c && time < c + 2 * DAY_MS) return false;
  for (const e of scenario.truth.events)
    if (time >= e.start - HOUR_MS && time <= e.end + 12 * HOUR_MS) return false;
  return true;
}

export function scenarioMetrics(scenario: Scenario, result: MethodResult): ScenarioMetrics {
  const refillType: TruthEventType = scenario.filling ? 'pickup' : 'delivery';
  const tolerance = Math.max(2 * scenario.intervalMs, 2 * HOUR_MS);
  const eventVolumeErrors: number[] = [];
  const of = (type: TruthEventType) => ({
    truth: scenario.truth.events.filter((e) => e.type === type),
    found: result.events.filter((e) => e.type === type),
  });
  const r = of(refillType);
  const w = of('withdrawal');
  const times = scenario.readings.map((x) => x.time);
  const toleranceOf = (e: TruthEvent) => startTolerance(times, e, tolerance);
  const refill = matchEvents(r.truth, r.found, toleranceOf, eventVolumeErrors);
  const withdrawal = matchEvents(w.truth, w.found, toleranceOf, eventVolumeErrors);

  const start = scenario.readings[0]?.time ?? 0;
  const target = scenario.filling ? scenario.capacity : 0;
  const rateErrors: number[] = [];
  const runwayErrors: number[] = [];
  let rateCovered = 0;
  let runwayCovered = 0;
  let runwayCount = 0;
  for (const p of result.points) {
    if (!isSteady(p.time, scenario, start)) continue;
    const trueRate = scenario.truth.rateAt(p.time);
    rateErrors.push(Math.abs(p.rate - trueRate) / Math.abs(trueRate));
    if (p.rateLow <= trueRate && trueRate <= p.rateHigh) rateCovered++;
    const trueVolume = scenario.truth.volumeAt(p.time);
    const trueDays = (scenario.filling ? target - trueVolume : trueVolume - target) / Math.abs(trueRate);
    if (!(trueDays > 0.5)) continue;
    const est = runwayTo(p, { volume: target }, { filling: scenario.filling });
    runwayCount++;
    runwayErrors.push(est.days === null ? 1 : Math.min(1, Math.abs(est.days - trueDays) / trueDays));
    if (
      (est.daysLow ?? Number.POSITIVE_INFINITY) <= trueDays &&
      trueDays <= (est.daysHigh ?? Number.POSITIVE_INFINITY)
    ) {
      runwayCovered++;
    }
  }
  return {
    refill,
    withdrawal,
    eventVolumeErrors,
    rateErrors,
    rateCovered: rateErrors.length > 0 ? rateCovered / rateErrors.length : Number.NaN,
    runwayErrors,
    runwayCovered: runwayCount > 0 ? runwayCovered / runwayCount : Number.NaN,
    lags: adaptationLags(scenario, result.points, scenario.truth.rateAt),
    dayUseLags: adaptationLags(scenario, result.points, scenario.truth.dayUseAt),
  };
}

/**
 * Hours after each rate change until the rate is within 20% of `truthAt` and stays there a day (240 when
 * never within 10 days). Against the regime rate (a weekly mean) a weekend dip of up to a quarter can hold a
 * faithful estimate outside the band for reasons other than the change; against the day's use it cannot.
 */
function adaptationLags(
  scenario: Scenario,
  points: MethodPoint[],
  truthAt: (time: number) => number,
): number[] {
  const lags: number[] = [];
  const end = points[points.length - 1]?.time ?? 0;
  const changes = scenario.truth.changes;
  changes.forEach((c, k) => {
    const next = changes[k + 1] ?? Number.POSITIVE_INFINITY;
    if (c + 3 * DAY_MS > Math.min(end, next)) return;
    const after = points.filter((p) => p.time >= c && p.time < Math.min(next, c + 10 * DAY_MS));
    const ok = after.map((p) => {
      const truth = truthAt(p.time);
      return Math.abs(p.rate - truth) <= 0.2 * Math.abs(truth);
    });
    let lag = 10 * 24;
    for (let i = 0; i < after.length; i++) {
      let stays = true;
      for (let j = i; j < after.length && after[j]!.time <= after[i]!.time + DAY_MS; j++) {
        if (!ok[j]) {
          stays = false;
          i = j;
          break;
        }
      }
      if (stays) {
        lag = (after[i]!.time - c) / HOUR_MS;
        break;
      }
    }
    lags.push(lag);
  });
  return lags;
}

export interface FamilySummary {
  scenarios: number;
  refillF1: number;
  refillPrecision: number;
  refillRecall: number;
  withdrawalF1: number;
  eventVolumeError: number;
  rateError: number;
  runwayError: number;
  rateCoverage: number;
  runwayCoverage: number;
  lagMedianHours: number;
  lagWorstHours: number;
  dayUseLagMedianHours: number;
  dayUseLagWorstHours: number;
}

export const median = (xs: number[]): number => {
  if (xs.length === 0) return Number.NaN;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};

const f1 = (c: Counts) => {
  const p = c.tp + c.fp > 0 ? c.tp / (c.tp + c.fp) : 1;
  const r = c.tp + c.fn > 0 ? c.tp / (c.tp + c.fn) : 1;
  return { p, r, f1: p + r > 0 ? (2 * p * r) / (p + r) : 0 };
};

const sum = (cs: Counts[]): Counts => ({
  tp: cs.reduce((a, c) => a + c.tp, 0),
  fp: cs.reduce((a, c) => a + c.fp, 0),
  fn: cs.reduce((a, c) => a + c.fn, 0),
});

const meanOf = (xs: number[]) => {
  const ok = xs.filter((x) => Number.isFinite(x));
  return ok.length ? ok.reduce((a, b) => a + b, 0) / ok.length : Number.NaN;
};

export function summarise(all: ScenarioMetrics[]): FamilySummary {
  const refill = f1(sum(all.map((m) => m.refill)));
  const withdrawal = f1(sum(all.map((m) => m.withdrawal)));
  const lags = all.flatMap((m) => m.lags);
  const dayUseLags = all.flatMap((m) => m.dayUseLags);
  return {
    scenarios: all.length,
    refillF1: refill.f1,
    refillPrecision: refill.p,
    refillRecall: refill.r,
    withdrawalF1: withdrawal.f1,
    eventVolumeError: median(all.flatMap((m) => m.eventVolumeErrors)),
    rateError: median(all.flatMap((m) => m.rateErrors)),
    runwayError: median(all.flatMap((m) => m.runwayErrors)),
    rateCoverage: meanOf(all.map((m) => m.rateCovered)),
    runwayCoverage: meanOf(all.map((m) => m.runwayCovered)),
    lagMedianHours: median(lags),
    lagWorstHours: lags.length ? Math.max(...lags) : Number.NaN,
    dayUseLagMedianHours: median(dayUseLags),
    dayUseLagWorstHours: dayUseLags.length ? Math.max(...dayUseLags) : Number.NaN,
  };
}

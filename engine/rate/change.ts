// Rate changes: two-sided CUSUM on standardised innovations (E. S. Page, "Continuous inspection schemes",
// Biometrika 41, 1954); on an alarm the level and rate are refit by least squares from the readings after the
// best single slope split (recent.ts), and the change is reported once the new rate has settled.
import { bestSplit, fitRecent, type LineFit } from './recent.js';
import * as tuning from './tuning.js';
import type { RateEstimatorState } from './types.js';

const { CHANGE_SETTLE_DAYS, CUSUM_H, CUSUM_K, DAY_MS, RELEARN_WIDEN } = tuning;

export function resetCusum(s: RateEstimatorState): void {
  s.cusumPos = 0;
  s.cusumNeg = 0;
}

/**
 * One CUSUM step for standardised innovation `z` counted with `weight` (dense readings are not independent);
 * `before` is the rate before this reading's update, R the measurement noise.
 */
export function detectChange(
  s: RateEstimatorState,
  time: number,
  z: number,
  before: number,
  weight: number,
  R: number,
): void {
  if (s.cusumPos === 0) s.cusumPosStart = time;
  if (s.cusumNeg === 0) s.cusumNegStart = time;
  s.cusumPos = Math.max(0, s.cusumPos + weight * (z - CUSUM_K));
  s.cusumNeg = Math.max(0, s.cusumNeg + weight * (-z - CUSUM_K));
  if (s.cusumPos > CUSUM_H || s.cusumNeg > CUSUM_H) {
    const at = s.cusumPos > CUSUM_H ? s.cusumPosStart : s.cusumNegStart;
    relearn(s, at, time, R);
    if (!s.changePending) s.changePending = { at, from: before, alarm: time, count: s.count };
    resetCusum(s);
  }
  const pendingChange = s.changePending;
  if (
    pendingChange &&
    time - pendingChange.alarm >= CHANGE_SETTLE_DAYS * DAY_MS &&
    s.count - pendingChange.count >= 3
  ) {
    const { at, from } = pendingChange;
    if (Math.abs(s.r - from) > 0.2 * Math.max(Math.abs(from), Math.abs(s.r))) {
      s.changes.push({ at, from, to: s.r });
    }
    s.changePending = null;
  }
}

/** The filter restarts from a least-squares refit of the readings since a change. */
export function adoptFit(s: RateEstimatorState, fit: LineFit): void {
  s.v = fit.v;
  s.r = fit.r;
  s.p00 = fit.p00 * RELEARN_WIDEN;
  s.p01 = fit.p01 * RELEARN_WIDEN;
  s.p11 = fit.p11 * RELEARN_WIDEN;
  s.basisCount = s.count - fit.count + 1;
}

/**
 * After an alarm: refit level and rate by least squares on the readings since the change began; with too
 * few, forget the old rate instead. Returns where the new rate's basis starts.
 */
function relearn(s: RateEstimatorState, at: number, time: number, R: number): number {
  const split = bestSplit(s, time, 4);
  const from = split ?? at;
  const fit = fitRecent(s, from, time, R);
  if (fit) {
    adoptFit(s, fit);
  } else {
    s.p11 += (Math.abs(s.r) + 1e-3 * Math.max(s.scale, 1)) ** 2;
    s.p00 += 4 * R;
    s.p01 = 0;
    s.basisCount = s.count;
  }
  s.basisStart = from;
  return from;
}

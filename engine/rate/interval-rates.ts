// Manual dips: the use between two consecutive dips is a direct look at the rate, whatever the filter made of
// either dip (trusted, waiting, taken for a typo). A change of use shows as several such intervals off the
// filter's rate on the same side; the filter alone misses it when deliveries keep cutting the run of trusted
// dips (each resets the change detector) and each steep dip is held back as a possible typo. Rule: a change
// when INTERVAL_RATE_AGREE of the last INTERVAL_RATE_KEPT intervals lie beyond INTERVAL_RATE_Z standard
// deviations on the same side, a k-of-n runs rule in the manner of the Western Electric zone rules
// (Western Electric Co., "Statistical Quality Control Handbook", 1956). One typo or one withdrawal makes one
// steep interval, not three. An interval with a rise in it (a delivery or a typo) says nothing and is
// skipped; one with a logged delivery in it counts the logged volume as use made up.
import { resetCusum } from './change.js';
import { noiseVar } from './state.js';
import * as tuning from './tuning.js';
import type { RateEstimatorState } from './types.js';

const {
  DAY_MS,
  EVENT_MIN_FRACTION,
  INTERVAL_MIN_DAYS,
  INTERVAL_RATE_AGREE,
  INTERVAL_RATE_KEPT,
  INTERVAL_RATE_WIDEN,
  INTERVAL_RATE_Z,
} = tuning;

/** A delivery logged since the previous dip: its volume is use the next dip's drop does not show. */
export function noteLoggedForIntervals(s: RateEstimatorState, time: number, volume: number): void {
  if (s.previousDip !== null && time > s.previousDip.time) s.loggedSinceDip += volume;
}

/**
 * Records the interval from the previous dip to this one and, when the recent intervals agree on another
 * rate, re-learns it (the filter's rate and its variance) and marks a change. Says whether it did.
 */
export function checkIntervalRates(s: RateEstimatorState, time: number, volume: number): boolean {
  const previous = s.previousDip;
  const logged = s.loggedSinceDip;
  s.loggedSinceDip = 0;
  if (previous === null) {
    s.previousDip = { time, volume };
    return false;
  }
  // Kept in place: one object a series, not one a reading.
  const from = previous.time;
  const days = (time - from) / DAY_MS;
  const useSign = s.filling ? -1 : 1;
  const use = (previous.volume - volume) * useSign + logged;
  previous.time = time;
  previous.volume = volume;
  if (days < INTERVAL_MIN_DAYS) return false;
  const R = noiseVar(s);
  if (isRise(s, -use)) return false;
  const intervals = s.dipIntervals;
  intervals.push({ from, days, use });
  if (intervals.length > INTERVAL_RATE_KEPT) intervals.shift();

  // Each interval's rate against the filter's, in standard deviations: two dips' noise over its length,
  // and the filter's own rate uncertainty.
  const rate = s.r * useSign;
  let above = 0;
  let below = 0;
  for (const i of intervals) {
    const z = zOf(i, rate, R, s.p11);
    if (z > INTERVAL_RATE_Z) above++;
    else if (z < -INTERVAL_RATE_Z) below++;
  }
  const side = above >= INTERVAL_RATE_AGREE ? 1 : below >= INTERVAL_RATE_AGREE ? -1 : 0;
  if (side === 0) return false;

  // The new rate: the agreeing intervals' rates weighted by their inverse variance (their length squared).
  let weight = 0;
  let weighted = 0;
  let at = time;
  for (const i of intervals) {
    if (zOf(i, rate, R, s.p11) * side <= INTERVAL_RATE_Z) continue;
    const w = (i.days * i.days) / (2 * R);
    weight += w;
    weighted += (w * i.use) / i.days;
    at = Math.min(at, i.from);
  }
  const before = s.r;
  s.r = (weighted / weight) * useSign;
  s.p11 = INTERVAL_RATE_WIDEN / weight;
  s.p01 = 0;
  resetCusum(s);
  s.basisStart = at;
  s.basisCount = s.count - INTERVAL_RATE_AGREE;
  if (!s.changePending) s.changePending = { at, from: before, alarm: time, count: s.count };
  s.dipIntervals = [];
  return true;
}

/** Whether a dip `litres` beyond the one before it in the refill direction rose beyond the dips' noise. */
function isRise(s: RateEstimatorState, litres: number): boolean {
  return litres > Math.max(EVENT_MIN_FRACTION * (s.capacity ?? s.scale), 2 * Math.sqrt(noiseVar(s)));
}

function zOf(i: { days: number; use: number }, rate: number, R: number, p11: number): number {
  return (i.use / i.days - rate) / Math.sqrt((2 * R) / (i.days * i.days) + p11);
}

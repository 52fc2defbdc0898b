// Rate changes the CUSUM is slow to see. Its standardised innovations chase a slope change the filter is
// already half following, so a halving of use on an hourly sensor took a day or more to raise an alarm. Every
// hour of data this check fits a least-squares line to the readings of each trailing window of 20 hours to
// two days and asks whether its rate differs from the filter's by more than SLOPE_MARGIN of the rate: a test
// for a slope change at an unknown instant (the generalised likelihood ratio of Willsky & Jones, IEEE Trans.
// Automatic Control 21, 1976; from memory) with a least effect size, so a weekend's lighter use is not a
// change. It acts only when the CUSUM already leans the same way (SLOPE_CUSUM). The line is fitted in "use
// time": each reading's hour carries the daily profile's use part, so a window of working hours does not
// pass for faster use (profile.ts).
import { adoptFit, resetCusum } from './change.js';
import { hourOfDay, useProfileAt } from './profile.js';
import { lineFromSums } from './recent.js';
import * as tuning from './tuning.js';
import type { RateEstimatorState } from './types.js';

const {
  CUSUM_DECORRELATION_DAYS,
  DAY_MS,
  SLOPE_CHECK_EVERY_MS,
  SLOPE_CUSUM,
  SLOPE_MARGIN,
  SLOPE_MIN_DAYS,
  SLOPE_MIN_READINGS,
  SLOPE_STEP_F,
  SLOPE_WINDOW_DAYS,
  SLOPE_Z,
} = tuning;

/** Sums over a window's points (x, y): count, x, y, x^2, x y, y^2. */
interface Sums {
  n: number;
  sx: number;
  sy: number;
  sxx: number;
  sxy: number;
  syy: number;
}

const NO_SUMS: Sums = { n: 0, sx: 0, sy: 0, sxx: 0, sxy: 0, syy: 0 };

/** Runs once per SLOPE_CHECK_EVERY_MS of data time, after the reading at `time` (the previous at `previous`). */
export function checkSlope(s: RateEstimatorState, time: number, previous: number, R: number): void {
  if (Math.floor(time / SLOPE_CHECK_EVERY_MS) === Math.floor(previous / SLOPE_CHECK_EVERY_MS)) return;
  // Without the CUSUM leaning either way no window can pass (the test at the end): skip the fits, which
  // cost about half a microsecond per 5-minute reading when run every hour (npm run bench rate).
  if (s.cusumNeg < SLOPE_CUSUM && s.cusumPos < SLOPE_CUSUM) return;
  const times = s.recentTimes;
  const r = s.r;
  // Readings closer together than the decorrelation time are not independent evidence (as in the CUSUM).
  const correlation = Math.max(1, CUSUM_DECORRELATION_DAYS / s.dtMean);
  const from = Math.max(time - SLOPE_WINDOW_DAYS * DAY_MS, s.basisStart);
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  let bestScore = SLOPE_Z;
  let best = { i: -1, cxx: 0, slope: 0, sigma2: 0, rss: 0, sums: NO_SUMS };
  // Windows grow backwards from the newest reading; running sums make each one O(1).
  for (let i = times.length - 1; i >= 0 && times[i]! >= from; i--) {
    const u = useAt(s, i);
    const x = (times[i]! - time) / DAY_MS - u;
    const y = s.recentVolumes[i]! + r * u;
    n++;
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
    syy += y * y;
    if (n < SLOPE_MIN_READINGS || time - times[i]! < SLOPE_MIN_DAYS * DAY_MS) continue;
    const cxx = sxx - (sx * sx) / n;
    if (!(cxx > 0)) continue;
    const cxy = sxy - (sx * sy) / n;
    const slope = cxy / cxx;
    const rss = Math.max(0, syy - (sy * sy) / n - slope * cxy);
    const sigma2 = Math.max(R, rss / (n - 2));
    const sd = Math.sqrt((sigma2 * correlation) / cxx);
    const score = (Math.abs(-slope - r) - SLOPE_MARGIN * Math.abs(r)) / sd;
    if (score > bestScore) {
      bestScore = score;
      best = { i, cxx, slope, sigma2, rss, sums: { n, sx, sy, sxx, sxy, syy } };
    }
  }
  if (best.i < 0) return;
  // Faster use leaves readings below the prediction: the CUSUM of negative innovations must lean that way.
  const leaning = -best.slope > r ? s.cusumNeg : s.cusumPos;
  if (leaning < SLOPE_CUSUM || stepInstead(s, best.i, time, best.rss, best.sums)) return;
  const at = times[best.i]!;
  if (!s.changePending) s.changePending = { at, from: r, alarm: time, count: s.count };
  const w = best.sums;
  adoptFit(s, lineFromSums(w.n, w.sx / w.n, w.sy / w.n, best.cxx, best.slope, best.sigma2));
  s.basisStart = at;
  resetCusum(s);
}

// Kept readings are net of the profile at the rate then; lines are fitted to the level plus the use part
// (y + r u) against use time (t - u, days from the check), whose slope is the rate whatever it now is.
// The use part u (days) at kept reading i:
const useAt = (s: RateEstimatorState, i: number) => useProfileAt(s, hourOfDay(s.recentTimes[i]!));

/**
 * Whether a level shift at the old rate explains the window from reading `first` on (its sums `w`) better than
 * the one line (residual sum of squares `lineRss`) does: a withdrawal too small for the noise to flag it as an event
 * would otherwise pass for a day of faster use, and the rate that follows makes every next day's readings a
 * "delivery". The shift is the best of one at each reading (a line with a step, least squares, O(1) per step
 * from suffix sums); it explains the window when it removes most of the line's misfit (an F ratio of
 * SLOPE_STEP_F on one parameter) with a rate within SLOPE_MARGIN of the filter's.
 */
function stepInstead(s: RateEstimatorState, first: number, time: number, lineRss: number, w: Sums): boolean {
  const last = s.recentTimes.length - 1;
  const { n: N, sx: X, sy: Y, sxx: XX, sxy: XY, syy: YY } = w;
  // Suffix sums over the readings from the step on: the step's column is 1 there.
  let m = 0;
  let sx = 0;
  let sy = 0;
  let bestRss = Number.POSITIVE_INFINITY;
  let bestRate = 0;
  for (let k = last; k > first; k--) {
    const u = useAt(s, k);
    m++;
    sx += (s.recentTimes[k]! - time) / DAY_MS - u;
    sy += s.recentVolumes[k]! + s.r * u;
    if (m < SLOPE_MIN_READINGS / 2 || N - m < SLOPE_MIN_READINGS / 2) continue;
    const fit = solve3([N, X, m, X, XX, sx, m, sx, m], [Y, XY, sy]);
    if (!fit) continue;
    const rss = YY - (fit[0] * Y + fit[1] * XY + fit[2] * sy);
    if (rss < bestRss) {
      bestRss = rss;
      bestRate = -fit[1];
    }
  }
  if (!Number.isFinite(bestRss) || N <= 3) return false;
  const f = (lineRss - bestRss) / (Math.max(bestRss, 0) / (N - 3) || Number.MIN_VALUE);
  return f > SLOPE_STEP_F && Math.abs(bestRate - s.r) <= SLOPE_MARGIN * Math.abs(s.r);
}

/** Solves the symmetric 3 x 3 system a p = b (row-major a) by Cramer's rule; null when singular. */
function solve3(a: number[], b: number[]): [number, number, number] | null {
  const [a0, a1, a2, a3, a4, a5, a6, a7, a8] = a as [
    number,
    number,
    number,
    number,
    number,
    number,
    number,
    number,
    number,
  ];
  const [b0, b1, b2] = b as [number, number, number];
  const det = a0 * (a4 * a8 - a5 * a7) - a1 * (a3 * a8 - a5 * a6) + a2 * (a3 * a7 - a4 * a6);
  if (!(Math.abs(det) > 0) || !Number.isFinite(det)) return null;
  return [
    (b0 * (a4 * a8 - a5 * a7) - a1 * (b1 * a8 - a5 * b2) + a2 * (b1 * a7 - a4 * b2)) / det,
    (a0 * (b1 * a8 - a5 * b2) - b0 * (a3 * a8 - a5 * a6) + a2 * (a3 * b2 - b1 * a6)) / det,
    (a0 * (a4 * b2 - b1 * a7) - a1 * (a3 * b2 - b1 * a6) + b0 * (a3 * a7 - a4 * a6)) / det,
  ];
}

// Rate changes the CUSUM is slow to see. Its standardised innovations chase a slope change the filter is
// already half following, so a halving of use on an hourly sensor took a day or more to raise an alarm. Every
// hour of data this check fits a least-squares line to the readings of each trailing window of one to two
// days and asks whether its rate differs from the filter's by more than SLOPE_MARGIN of the rate: a test
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
  SLOPE_WINDOW_DAYS,
  SLOPE_Z,
} = tuning;

/** Runs once per SLOPE_CHECK_EVERY_MS of data time, after the reading at `time` (the previous at `previous`). */
export function checkSlope(s: RateEstimatorState, time: number, previous: number, R: number): void {
  if (Math.floor(time / SLOPE_CHECK_EVERY_MS) === Math.floor(previous / SLOPE_CHECK_EVERY_MS)) return;
  const times = s.recentTimes;
  const volumes = s.recentVolumes;
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
  let best = { i: -1, n: 0, mx: 0, my: 0, cxx: 0, slope: 0, sigma2: 0 };
  // Windows grow backwards from the newest reading; running sums make each one O(1).
  for (let i = times.length - 1; i >= 0 && times[i]! >= from; i--) {
    // Kept readings are net of the profile at the rate then; the line is fitted to the level plus the
    // use part (y + r u) against use time (t - u), whose slope is the rate whatever it now is.
    const u = useProfileAt(s, hourOfDay(times[i]!));
    const x = (times[i]! - time) / DAY_MS - u;
    const y = volumes[i]! + r * u;
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
    const sigma2 = Math.max(R, Math.max(0, syy - (sy * sy) / n - slope * cxy) / (n - 2));
    const sd = Math.sqrt((sigma2 * correlation) / cxx);
    const score = (Math.abs(-slope - r) - SLOPE_MARGIN * Math.abs(r)) / sd;
    if (score > bestScore) {
      bestScore = score;
      best = { i, n, mx: sx / n, my: sy / n, cxx, slope, sigma2 };
    }
  }
  if (best.i < 0) return;
  // Faster use leaves readings below the prediction: the CUSUM of negative innovations must lean that way.
  const leaning = -best.slope > r ? s.cusumNeg : s.cusumPos;
  if (leaning < SLOPE_CUSUM) return;
  const at = times[best.i]!;
  if (!s.changePending) s.changePending = { at, from: r, alarm: time, count: s.count };
  adoptFit(s, lineFromSums(best.n, best.mx, best.my, best.cxx, best.slope, best.sigma2));
  s.basisStart = at;
  resetCusum(s);
}

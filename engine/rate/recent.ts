// Trusted readings since the change detector last had no evidence: on an alarm the level and rate are refit
// from them by least squares, so the new rate starts from the data since the change, not from a lagging level.
import { DAY_MS } from './tuning.js';

export interface RecentReadings {
  recentTimes: number[];
  recentVolumes: number[];
}

export function pushRecent(s: RecentReadings, time: number, volume: number): void {
  s.recentTimes.push(time);
  s.recentVolumes.push(volume);
}

export function clearRecent(s: RecentReadings): void {
  s.recentTimes.length = 0;
  s.recentVolumes.length = 0;
}

/** A level shift (delivery, withdrawal) moved the level by `shift`: the readings before it move with it. */
export function shiftRecent(s: RecentReadings, shift: number): void {
  const v = s.recentVolumes;
  for (let i = 0; i < v.length; i++) v[i] = v[i]! + shift;
}

/** The newest trusted reading's volume, or `fallback` when none is kept (the level a shift restarted at). */
export function lastRecentVolume(s: RecentReadings, fallback: number): number {
  const n = s.recentVolumes.length;
  return n > 0 ? s.recentVolumes[n - 1]! : fallback;
}

/** Drops readings before `from`, in batches so the cost stays constant per reading. */
export function trimRecent(s: RecentReadings, from: number): void {
  const times = s.recentTimes;
  // Looked at once every 64 readings, so the scan below costs O(1) per reading.
  if (times.length < 64 || (times.length & 63) !== 0 || times[0]! >= from) return;
  let cut = 0;
  while (cut < times.length && times[cut]! < from) cut++;
  if (cut * 4 < times.length && times.length < 4096) return;
  times.splice(0, cut);
  s.recentVolumes.splice(0, cut);
}

export interface LineFit {
  /** Volume at `at`, rate (L/day, positive while emptying) and their covariance. */
  v: number;
  r: number;
  p00: number;
  p01: number;
  p11: number;
  count: number;
}

/**
 * Where the slope changed: the split of the recent readings that minimises the residual sum of squares of two
 * separate least-squares lines (a single change in slope; cf. PELT/CPOP segmentation, Killick et al. 2012,
 * Fearnhead et al. 2019, restricted to one change). Prefix sums make every split O(1). Returns a time.
 */
export function bestSplit(s: RecentReadings, at: number, minSide: number): number | null {
  const t = s.recentTimes;
  const y = s.recentVolumes;
  const n = t.length;
  if (n < 2 * minSide) return null;
  const S = new Float64Array(5 * (n + 1));
  for (let i = 0; i < n; i++) {
    const x = (t[i]! - at) / DAY_MS;
    const b = 5 * i;
    S[b + 5] = S[b]! + x;
    S[b + 6] = S[b + 1]! + y[i]!;
    S[b + 7] = S[b + 2]! + x * x;
    S[b + 8] = S[b + 3]! + x * y[i]!;
    S[b + 9] = S[b + 4]! + y[i]! * y[i]!;
  }
  const rss = (lo: number, hi: number) => {
    const m = hi - lo;
    const sx = S[5 * hi]! - S[5 * lo]!;
    const sy = S[5 * hi + 1]! - S[5 * lo + 1]!;
    const sxx = S[5 * hi + 2]! - S[5 * lo + 2]! - (sx * sx) / m;
    const sxy = S[5 * hi + 3]! - S[5 * lo + 3]! - (sx * sy) / m;
    const syy = S[5 * hi + 4]! - S[5 * lo + 4]! - (sy * sy) / m;
    return sxx > 0 ? syy - (sxy * sxy) / sxx : syy;
  };
  let best = -1;
  let bestCost = Number.POSITIVE_INFINITY;
  for (let k = minSide; k <= n - minSide; k++) {
    const cost = rss(0, k) + rss(k, n);
    if (cost < bestCost) {
      bestCost = cost;
      best = k;
    }
  }
  return best >= 0 ? t[best]! : null;
}

/** Ordinary least-squares line through readings at or after `from`, evaluated at `at`; null if too few. */
export function fitRecent(s: RecentReadings, from: number, at: number, noiseVar: number): LineFit | null {
  const times = s.recentTimes;
  const volumes = s.recentVolumes;
  let n = 0;
  let sx = 0;
  let sy = 0;
  for (let i = times.length - 1; i >= 0 && times[i]! >= from; i--) {
    n++;
    sx += (times[i]! - at) / DAY_MS;
    sy += volumes[i]!;
  }
  if (n < 4) return null;
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = times.length - n; i < times.length; i++) {
    const dx = (times[i]! - at) / DAY_MS - mx;
    sxx += dx * dx;
    sxy += dx * (volumes[i]! - my);
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;
  let rss = 0;
  for (let i = times.length - n; i < times.length; i++) {
    const x = (times[i]! - at) / DAY_MS;
    rss += (volumes[i]! - my - slope * (x - mx)) ** 2;
  }
  return lineFromSums(n, mx, my, sxx, slope, Math.max(rss / (n - 2), noiseVar));
}

/**
 * The fit of a least-squares line y = my + slope (x - mx) through n points whose x (days from the instant the
 * line is evaluated at) have mean mx and centred sum of squares sxx, residual variance sigma2.
 */
export function lineFromSums(
  n: number,
  mx: number,
  my: number,
  sxx: number,
  slope: number,
  sigma2: number,
): LineFit {
  return {
    v: my - slope * mx,
    r: -slope,
    p00: sigma2 * (1 / n + (mx * mx) / sxx),
    p01: (mx * sigma2) / sxx,
    p11: sigma2 / sxx,
    count: n,
  };
}

// The two baselines the estimator is measured against, both causal: a least-squares slope of the raw
// readings over the last 7 days, and the same after taking out rises larger than 5% of capacity (treated as
// deliveries). Ordinary least squares with its textbook standard error of the slope.
import type { TimedVolume } from '../../engine/rate/index.js';
import type { MethodResult } from './metrics.js';

const DAY_MS = 86_400_000;
const Z80 = 1.2815515655446004;

/** `removeRefills`: take out jumps toward full (rises; drops on a filling tank, whose refill is a pick-up). */
export function leastSquaresBaseline(
  readings: readonly TimedVolume[],
  capacity: number,
  removeRefills: boolean,
  filling = false,
): MethodResult {
  const sign = filling ? -1 : 1;
  const n = readings.length;
  const adjusted = new Float64Array(n);
  const events: MethodResult['events'] = [];
  let offset = 0;
  for (let i = 0; i < n; i++) {
    const r = readings[i]!;
    if (removeRefills && i > 0) {
      const rise = r.volume - readings[i - 1]!.volume;
      if (sign * rise > 0.05 * capacity) {
        offset += rise;
        const type = filling ? 'pickup' : 'delivery';
        events.push({ type, start: readings[i - 1]!.time, end: r.time, volume: Math.abs(rise) });
      }
    }
    adjusted[i] = r.volume - offset;
  }
  // Prefix sums (times in days from the first reading) give each 7-day window in O(1).
  const t0 = n > 0 ? readings[0]!.time : 0;
  const P = { x: new Float64Array(n + 1), y: new Float64Array(n + 1), xx: new Float64Array(n + 1) };
  const Pxy = new Float64Array(n + 1);
  const Pyy = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const x = (readings[i]!.time - t0) / DAY_MS;
    const y = adjusted[i]!;
    P.x[i + 1] = P.x[i]! + x;
    P.y[i + 1] = P.y[i]! + y;
    P.xx[i + 1] = P.xx[i]! + x * x;
    Pxy[i + 1] = Pxy[i]! + x * y;
    Pyy[i + 1] = Pyy[i]! + y * y;
  }
  const points: MethodResult['points'] = [];
  let lo = 0;
  for (let i = 0; i < n; i++) {
    const t = readings[i]!.time;
    while (readings[lo]!.time < t - 7 * DAY_MS) lo++;
    const m = i - lo + 1;
    const sx = P.x[i + 1]! - P.x[lo]!;
    const sy = P.y[i + 1]! - P.y[lo]!;
    const sxx = P.xx[i + 1]! - P.xx[lo]! - (sx * sx) / m;
    const sxy = Pxy[i + 1]! - Pxy[lo]! - (sx * sy) / m;
    const syy = Pyy[i + 1]! - Pyy[lo]! - (sy * sy) / m;
    const slope = sxx > 1e-12 ? sxy / sxx : 0;
    const se = m > 2 && sxx > 1e-12 ? Math.sqrt(Math.max(0, syy - slope * sxy) / (m - 2) / sxx) : 0;
    const rate = -slope;
    points.push({
      time: t,
      volume: readings[i]!.volume,
      rate,
      rateLow: rate - Z80 * se,
      rateHigh: rate + Z80 * se,
    });
  }
  return { points, events };
}

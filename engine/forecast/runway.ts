// Runway: days until the filtered volume reaches a target at the current rate, with an ~80% range taken from
// the rate's ~80% range (the runway is distance / rate, monotone in the rate, so the interval maps across).
import type { RatePoint } from '../rate/types.js';

const DAY_MS = 86_400_000;

export interface Runway {
  /** Days to the target at the current rate; null when the volume is not moving toward the target. */
  days: number | null;
  daysLow: number | null;
  /** null when the slow end of the range never reaches the target. */
  daysHigh: number | null;
  /** Epoch ms at which the target is reached at the current rate. */
  runoutAt: number | null;
}

export interface RunwayOptions {
  /** A filling tank: the runway runs up to the target (to full). */
  filling?: boolean;
  capacity?: number;
}

export function runwayTo(
  point: Pick<RatePoint, 'time' | 'volume' | 'rate' | 'rateLow' | 'rateHigh'>,
  target: { volume: number },
  options: RunwayOptions = {},
): Runway {
  const filling = options.filling === true;
  const distance = filling ? target.volume - point.volume : point.volume - target.volume;
  // Speed toward the target, litres/day, and its range (fast end first).
  const speed = filling ? -point.rate : point.rate;
  const fast = filling ? -point.rateLow : point.rateHigh;
  const slow = filling ? -point.rateHigh : point.rateLow;
  if (!Number.isFinite(distance) || !Number.isFinite(speed)) {
    return { days: null, daysLow: null, daysHigh: null, runoutAt: null };
  }
  if (distance <= 0) return { days: 0, daysLow: 0, daysHigh: 0, runoutAt: point.time };
  if (!(speed > 0))
    return { days: null, daysLow: fast > 0 ? distance / fast : null, daysHigh: null, runoutAt: null };
  const days = distance / speed;
  return {
    days,
    daysLow: distance / Math.max(fast, speed),
    daysHigh: slow > 0 ? distance / Math.min(slow, speed) : null,
    runoutAt: point.time + days * DAY_MS,
  };
}

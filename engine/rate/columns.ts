// The batch path: a whole series through one estimator, its points written into typed arrays (a struct of
// arrays) instead of one object per reading, so a year of 5-minute readings makes no per-reading garbage.
// The points are the very numbers `addReading` gives: both copy the same scratch point (point.ts).
import type { Estimator } from './estimator.js';
import type { ScratchPoint } from './point.js';
import { inTimeOrder, type ReadingColumns } from './reading-columns.js';
import type { RateChange, RatePoint, SuspectReading, TankEvent, TimedVolume } from './types.js';

export interface SeriesColumns {
  length: number;
  time: Float64Array;
  volume: Float64Array;
  rate: Float64Array;
  rateLow: Float64Array;
  rateHigh: Float64Array;
  rateSigma: Float64Array;
  readings: Float64Array;
  basisDays: Float64Array;
  /** Why each reading was not trusted; undefined when it was. */
  suspect: (string | undefined)[];
  events: TankEvent[];
  changes: RateChange[];
  suspects: SuspectReading[];
}

/**
 * Feeds readings (in time order) and logged deliveries merged in time order (a delivery logged at the same
 * instant as a reading goes first); `take` sees each reading's point, valid only during the call.
 */
export function feedMerged(
  estimator: Estimator,
  readings: ReadingColumns,
  deliveries: readonly TimedVolume[],
  take: (index: number, point: ScratchPoint) => void,
): void {
  const { time, volume } = readings;
  const sortedDeliveries = inTimeOrder(deliveries);
  let d = 0;
  for (let i = 0; i < time.length; i++) {
    const at = time[i]!;
    while (d < sortedDeliveries.length && sortedDeliveries[d]!.time <= at) {
      estimator.addDelivery(sortedDeliveries[d]!.time, sortedDeliveries[d]!.volume);
      d++;
    }
    // A volume column shorter than the times gives undefined, which the estimator refuses as not a number.
    take(i, estimator.step(at, volume[i]!));
  }
  for (; d < sortedDeliveries.length; d++)
    estimator.addDelivery(sortedDeliveries[d]!.time, sortedDeliveries[d]!.volume);
}

export function columnsFrom(
  estimator: Estimator,
  readings: ReadingColumns,
  deliveries: readonly TimedVolume[],
): SeriesColumns {
  const n = readings.time.length;
  // Local arrays, not fields of the result: the per-reading closure below then stores straight into them.
  const time = new Float64Array(n);
  const volume = new Float64Array(n);
  const rate = new Float64Array(n);
  const rateLow = new Float64Array(n);
  const rateHigh = new Float64Array(n);
  const rateSigma = new Float64Array(n);
  const count = new Float64Array(n);
  const basisDays = new Float64Array(n);
  // Sized up front (a push per reading costs more): feedMerged gives every index once, so none stays a hole.
  const suspect = new Array<string | undefined>(n);
  feedMerged(estimator, readings, deliveries, (i, p) => {
    time[i] = p.time;
    volume[i] = p.volume;
    rate[i] = p.rate;
    rateLow[i] = p.rateLow;
    rateHigh[i] = p.rateHigh;
    rateSigma[i] = p.rateSigma;
    count[i] = p.readings;
    basisDays[i] = p.basisDays;
    suspect[i] = p.suspect;
  });
  return {
    length: n,
    time,
    volume,
    rate,
    rateLow,
    rateHigh,
    rateSigma,
    readings: count,
    basisDays,
    suspect,
    events: [...estimator.events],
    changes: [...estimator.changes],
    suspects: [...estimator.suspects],
  };
}

/** Point `i` of the columns as a RatePoint. */
export function pointAt(c: SeriesColumns, i: number): RatePoint {
  return {
    time: c.time[i]!,
    volume: c.volume[i]!,
    rate: c.rate[i]!,
    rateLow: c.rateLow[i]!,
    rateHigh: c.rateHigh[i]!,
    rateSigma: c.rateSigma[i]!,
    suspect: c.suspect[i],
    readings: c.readings[i]!,
    basisDays: c.basisDays[i]!,
  };
}

/** Every point as a RatePoint (for callers that want objects). */
export function pointsOf(c: SeriesColumns): RatePoint[] {
  const points: RatePoint[] = new Array(c.length);
  for (let i = 0; i < c.length; i++) points[i] = pointAt(c, i);
  return points;
}

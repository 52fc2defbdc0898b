// The consumption-rate estimator: public entry points (see estimator.ts for the method and its sources).
import { columnsFrom, feedMerged, type SeriesColumns } from './columns.js';
import { Estimator } from './estimator.js';
import { copyPoint } from './point.js';
import { columnsInTimeOrder, type ReadingColumns, readingColumns } from './reading-columns.js';
import { initialState } from './state.js';
import { isRateEstimatorState } from './state-check.js';
import type {
  RateChange,
  RateEstimator,
  RateEstimatorState,
  RateOptions,
  RatePoint,
  SuspectReading,
  TankEvent,
  TimedVolume,
} from './types.js';

export type {
  RateChange,
  RateEstimator,
  RateEstimatorState,
  RateOptions,
  RatePoint,
  SuspectReading,
  TankEvent,
  TankEventType,
  TimedVolume,
} from './types.js';

export function createRateEstimator(options?: RateOptions): RateEstimator {
  return new Estimator(initialState(options));
}

export { pointAt, pointsOf, type SeriesColumns } from './columns.js';
export { eventsOf } from './logged.js';
export type { ReadingColumns } from './reading-columns.js';
export { RATE_STATE_VERSION } from './state.js';
export { isRateEstimatorState } from './state-check.js';

/**
 * Resumes an estimator from `toJSON()` output: the same future readings give the same points. A state that
 * fails `isRateEstimatorState` (another version, damaged) is refused with an Error: check stored states
 * first and rebuild from the readings when the check fails.
 */
export function restoreRateEstimator(state: RateEstimatorState): RateEstimator {
  if (!isRateEstimatorState(state)) {
    throw new Error('restoreRateEstimator: not a current estimator state; rebuild it from the readings');
  }
  return new Estimator(structuredClone(state));
}

export interface SeriesAnalysis {
  points: RatePoint[];
  events: TankEvent[];
  changes: RateChange[];
  suspects: SuspectReading[];
}

/**
 * Batch over a series: readings and logged deliveries are merged in time order (a delivery logged at the
 * same instant as a reading goes first) and fed one by one, so the result equals feeding them incrementally.
 */
export function analyzeSeries(
  readings: readonly TimedVolume[],
  deliveries: readonly TimedVolume[],
  options?: RateOptions,
): SeriesAnalysis {
  const estimator = new Estimator(initialState(options));
  const points: RatePoint[] = new Array(readings.length);
  feedMerged(estimator, readingColumns(readings), deliveries, (i, p) => {
    points[i] = copyPoint(p);
  });
  return {
    points,
    events: [...estimator.events],
    changes: [...estimator.changes],
    suspects: [...estimator.suspects],
  };
}

/**
 * The same analysis as `analyzeSeries` with the points as columns of typed arrays: no object per reading,
 * for long series (the `analyze` command). `pointsOf` / `pointAt` turn them back into RatePoints. The readings
 * may come as columns too (a parsed CSV), so a long series makes no object per reading on the way in either.
 */
export function analyzeSeriesColumns(
  readings: readonly TimedVolume[] | ReadingColumns,
  deliveries: readonly TimedVolume[],
  options?: RateOptions,
): SeriesColumns {
  const input = isReadingColumns(readings) ? columnsInTimeOrder(readings) : readingColumns(readings);
  return columnsFrom(new Estimator(initialState(options)), input, deliveries);
}

const isReadingColumns = (readings: readonly TimedVolume[] | ReadingColumns): readings is ReadingColumns =>
  !Array.isArray(readings);

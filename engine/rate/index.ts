// The consumption-rate estimator: public entry points (see estimator.ts for the method and its sources).
import { Estimator } from './estimator.js';
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

/** The series sorted by time; an already sorted one (the usual case) is used as is, without a copy. */
function inTimeOrder(series: readonly TimedVolume[]): readonly TimedVolume[] {
  for (let i = 1; i < series.length; i++) {
    if (series[i]!.time < series[i - 1]!.time) return [...series].sort((a, b) => a.time - b.time);
  }
  return series;
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
  const estimator = createRateEstimator(options);
  const sortedReadings = inTimeOrder(readings);
  const sortedDeliveries = inTimeOrder(deliveries);
  const points: RatePoint[] = new Array(sortedReadings.length);
  let d = 0;
  for (let i = 0; i < sortedReadings.length; i++) {
    const reading = sortedReadings[i]!;
    while (d < sortedDeliveries.length && sortedDeliveries[d]!.time <= reading.time) {
      estimator.addDelivery(sortedDeliveries[d]!.time, sortedDeliveries[d]!.volume);
      d++;
    }
    points[i] = estimator.addReading(reading.time, reading.volume);
  }
  for (; d < sortedDeliveries.length; d++)
    estimator.addDelivery(sortedDeliveries[d]!.time, sortedDeliveries[d]!.volume);
  return {
    points,
    events: [...estimator.events],
    changes: [...estimator.changes],
    suspects: [...estimator.suspects],
  };
}

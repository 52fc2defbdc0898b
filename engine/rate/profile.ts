// A daily shape (working hours, thermal swing) would otherwise pass for rate changes. Dense series learn the
// level's mean deviation per hour of day (each hour's memory about PROFILE_MEMORY_DAYS) and readings are
// taken net of it: a seasonal adjustment in the spirit of the structural model's daily seasonal component
// (Harvey 1989, ch. 2), kept as 24 running means instead of extra filter states, for speed.
import * as tuning from './tuning.js';
import type { RateEstimatorState } from './types.js';

const { DENSE_INTERVAL_DAYS, PROFILE_MEMORY_DAYS } = tuning;

// Hour of the UTC day; one division and a small modulo (the hot path runs it for every dense reading).
const hourOfDay = (time: number) => {
  const hour = Math.floor(time / 3_600_000) % 24;
  return hour < 0 ? hour + 24 : hour;
};

/** The profile's deviation at this hour (zero-mean over the day); zero unless the series is dense. */
export function profileAt(s: RateEstimatorState, time: number): number {
  if (s.dtMean === 0 || s.dtMean >= DENSE_INTERVAL_DAYS) return 0;
  return s.dailyProfile[hourOfDay(time)]! - s.dailyProfileSum / 24;
}

/** `volume` was taken net of the profile; what the filter leaves of it adds to this hour's mean. */
export function learnProfile(s: RateEstimatorState, time: number, volume: number, dt: number): void {
  if (s.dtMean >= DENSE_INTERVAL_DAYS || dt <= 0) return;
  const profile = s.dailyProfile;
  const bin = hourOfDay(time);
  const weight = Math.min(0.3, (24 * dt) / PROFILE_MEMORY_DAYS);
  const step = weight * (volume - s.v);
  profile[bin] = profile[bin]! + step;
  s.dailyProfileSum += step;
}

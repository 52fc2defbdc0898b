// A daily shape (working hours, thermal swing) would otherwise pass for rate changes. Dense series learn the
// level's mean deviation per hour of day (each hour's memory about PROFILE_MEMORY_DAYS), in two parts: one in
// litres (a thermal swing does not change with use) and one per unit of the rate (working-hour use grows and
// shrinks with it, so after a rate change it is right at once, not days later). Readings are taken net of
// both: the structural model's daily seasonal component (Harvey 1989, ch. 2) with its use part multiplied by
// the rate, kept as running means instead of extra filter states, for speed.
import * as tuning from './tuning.js';
import type { RateEstimatorState } from './types.js';

const { DENSE_INTERVAL_DAYS, PROFILE_MEMORY_DAYS, USE_PROFILE_SHARE } = tuning;

// Hour of the UTC day; one division and a small modulo (the hot path runs it for every dense reading).
export const hourOfDay = (time: number) => {
  const hour = Math.floor(time / 3_600_000) % 24;
  return hour < 0 ? hour + 24 : hour;
};

/** Whether the series is dense: only then is there a daily profile. */
export const profiled = (s: RateEstimatorState) => s.dtMean > 0 && s.dtMean < DENSE_INTERVAL_DAYS;

/** The profile's part in litres at this hour (zero-mean over the day). */
export function fixedProfileAt(s: RateEstimatorState, hour: number): number {
  return s.dailyProfile[hour]! - s.dailyProfileSum / 24;
}

/** The profile's use part per unit rate at this hour, days (zero-mean over the day). */
export function useProfileAt(s: RateEstimatorState, hour: number): number {
  return s.useProfile[hour]! - s.useProfileSum / 24;
}

/**
 * What the filter leaves of a reading (`residual`, litres) adds to this hour's means: USE_PROFILE_SHARE of it
 * to the use part, divided by the rate, when the rate is known well enough to divide by; the rest to the part
 * in litres.
 */
export function learnProfile(
  s: RateEstimatorState,
  hour: number,
  residual: number,
  dt: number,
  rate: number,
  rateSd: number,
): void {
  const weight = Math.min(0.3, (24 * dt) / PROFILE_MEMORY_DAYS);
  let step = weight * residual;
  if (Math.abs(rate) > 3 * rateSd) {
    const before = s.useProfile[hour]!;
    // Bounded: no hour's use moves the level by more than a day's use from its mean.
    const after = Math.max(-1, Math.min(1, before + (USE_PROFILE_SHARE * step) / rate));
    s.useProfile[hour] = after;
    s.useProfileSum += after - before;
    step -= (after - before) * rate;
  }
  s.dailyProfile[hour] = s.dailyProfile[hour]! + step;
  s.dailyProfileSum += step;
}

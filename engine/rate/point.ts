// Building the RatePoint the estimator reports after each reading.
import * as tuning from './tuning.js';

const { DAY_MS, RATE_SIGMA_CORRELATION_DAYS, RATE_SIGMA_PER_OCTAVE, Z80 } = tuning;

import type { RateEstimatorState, RatePoint } from './types.js';

export function pointFrom(
  s: RateEstimatorState,
  time: number,
  volume: number,
  rateVar: number,
  suspect: string | undefined,
): RatePoint {
  const perWindow = s.dtMean > 0 ? RATE_SIGMA_CORRELATION_DAYS / s.dtMean : 1;
  const sigma = Math.sqrt(rateVar) * (1 + RATE_SIGMA_PER_OCTAVE * Math.log2(Math.max(1, perWindow)));
  const point: RatePoint = {
    time,
    volume,
    rate: s.r,
    rateLow: s.r - Z80 * sigma,
    rateHigh: s.r + Z80 * sigma,
    rateSigma: sigma,
    // Always present (undefined when trusted) so every point has one shape.
    suspect,
    readings: s.count - s.basisCount + 1,
    basisDays: (time - s.basisStart) / DAY_MS,
  };
  return point;
}

/** The point for a reading that was not used: the filter's last estimate, unchanged, with the reason. */
export function rejectedPoint(s: RateEstimatorState, time: number, reason: string): RatePoint {
  if (s.lastTime === null) {
    return {
      time: Number.isFinite(time) ? time : 0,
      volume: 0,
      rate: 0,
      rateLow: 0,
      rateHigh: 0,
      rateSigma: 0,
      suspect: reason,
      readings: 0,
      basisDays: 0,
    };
  }
  return pointFrom(s, Number.isFinite(time) ? time : s.lastTime, s.v, s.p11, reason);
}

// Building the RatePoint the estimator reports after each reading. The estimator fills one scratch point per
// reading (`writePoint`); `addReading` hands out a copy and the batch path (columns.ts) copies it into typed
// arrays, so no object is made per reading there.
import * as tuning from './tuning.js';

const { DAY_MS, RATE_SIGMA_CORRELATION_DAYS, Z80 } = tuning;

import type { RateEstimatorState, RatePoint } from './types.js';

/** A RatePoint whose fields the estimator overwrites for every reading. */
export interface ScratchPoint extends Omit<RatePoint, 'suspect'> {
  suspect: string | undefined;
}

export function scratchPoint(): ScratchPoint {
  return {
    time: 0,
    volume: 0,
    rate: 0,
    rateLow: 0,
    rateHigh: 0,
    rateSigma: 0,
    suspect: undefined,
    readings: 0,
    basisDays: 0,
  };
}

/** A fresh RatePoint with the scratch point's values (every point has one shape: `suspect` always present). */
export function copyPoint(p: ScratchPoint): RatePoint {
  return {
    time: p.time,
    volume: p.volume,
    rate: p.rate,
    rateLow: p.rateLow,
    rateHigh: p.rateHigh,
    rateSigma: p.rateSigma,
    suspect: p.suspect,
    readings: p.readings,
    basisDays: p.basisDays,
  };
}

export function writePoint(
  s: RateEstimatorState,
  time: number,
  volume: number,
  rateVar: number,
  suspect: string | undefined,
  out: ScratchPoint,
): ScratchPoint {
  const perWindow = s.dtMean > 0 ? RATE_SIGMA_CORRELATION_DAYS / s.dtMean : 1;
  const sigma = Math.sqrt(rateVar * Math.max(1, perWindow));
  out.time = time;
  out.volume = volume;
  out.rate = s.r;
  out.rateLow = s.r - Z80 * sigma;
  out.rateHigh = s.r + Z80 * sigma;
  out.rateSigma = sigma;
  out.suspect = suspect;
  out.readings = s.count - s.basisCount + 1;
  out.basisDays = (time - s.basisStart) / DAY_MS;
  return out;
}

/** The point for a reading that was not used: the filter's last estimate, unchanged, with the reason. */
export function writeRejectedPoint(
  s: RateEstimatorState,
  time: number,
  reason: string,
  out: ScratchPoint,
): ScratchPoint {
  if (s.lastTime === null) {
    out.time = Number.isFinite(time) ? time : 0;
    out.volume = 0;
    out.rate = 0;
    out.rateLow = 0;
    out.rateHigh = 0;
    out.rateSigma = 0;
    out.suspect = reason;
    out.readings = 0;
    out.basisDays = 0;
    return out;
  }
  return writePoint(s, Number.isFinite(time) ? time : s.lastTime, s.v, s.p11, reason, out);
}

// The estimator's state: its initial value, its version, and the measurement noise derived from it.
import type { RateEstimatorState, RateOptions } from './types.js';

/**
 * Bumped whenever the state's shape or meaning changes (2: recent readings kept for refits; 3: daily profile;
 * 4: its running sum; 5: the filter before a rate change, kept one reading; 6: the noise estimate in the
 * filter kept after a rise, which manual dips also keep after their first interval, and the intervals
 * between manual dips; 7: the daily profile's use part; 8: dense series refit after the slope check too, and
 * keep the evidence of a rate change across a delivery).
 */
export const RATE_STATE_VERSION = 8;

export function initialState(options: RateOptions = {}): RateEstimatorState {
  const capacity = options.capacity !== undefined && options.capacity > 0 ? options.capacity : null;
  return {
    version: RATE_STATE_VERSION,
    capacity,
    filling: options.filling === true,
    count: 0,
    lastTime: null,
    v: 0,
    r: 0,
    p00: 0,
    p01: 0,
    p11: 0,
    innovationVar: 0,
    dtMean: 0,
    scale: capacity ?? 0,
    cusumPos: 0,
    cusumNeg: 0,
    cusumPosStart: 0,
    cusumNegStart: 0,
    basisStart: 0,
    basisCount: 0,
    recentTimes: [],
    recentVolumes: [],
    dailyProfile: new Array(24).fill(0),
    dailyProfileSum: 0,
    useProfile: new Array(24).fill(0),
    useProfileSum: 0,
    pending: [],
    undo: null,
    rateUndo: null,
    loggedPending: [],
    previousDip: null,
    loggedSinceDip: 0,
    dipIntervals: [],
    changePending: null,
    events: [],
    changes: [],
    suspects: [],
  };
}

/** Measurement noise: mean squared innovation less the prediction's own variance, with a small floor. */
export function noiseVar(s: RateEstimatorState): number {
  const floor = (1e-4 * Math.max(s.scale, 1)) ** 2;
  return Math.max(s.innovationVar - s.p00, floor);
}

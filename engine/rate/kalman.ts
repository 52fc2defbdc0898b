// Continuous-time local-linear-trend Kalman filter: state (volume V, rate r), with V falling at r per day.
// Method: the structural "local linear trend" model with an integrated-random-walk rate, written for
// irregular sampling: F = [[1, -dt], [0, 1]], Q = q [[dt^3/3, -dt^2/2], [-dt^2/2, dt]].
// Source: A. C. Harvey, "Forecasting, Structural Time Series Models and the Kalman Filter" (1989), ch. 3 and
// 9 (continuous-time models); innovations are Huber-clipped (Cipra & Hanzak, robust Kalman filtering) so
// one spike below the event threshold cannot drag the rate.

/** The mutable numeric part of the estimator state the filter works on. */
export interface FilterState {
  v: number;
  r: number;
  p00: number;
  p01: number;
  p11: number;
}

export interface Prediction {
  v: number;
  p00: number;
  p01: number;
  p11: number;
}

/** Predicts the state dt days ahead with rate-noise intensity q (L^2/day^3). */
export function predict(s: FilterState, dt: number, q: number, out: Prediction): Prediction {
  const dt2 = dt * dt;
  out.v = s.v - s.r * dt;
  out.p00 = s.p00 - 2 * dt * s.p01 + dt2 * s.p11 + (q * dt2 * dt) / 3;
  out.p01 = s.p01 - dt * s.p11 - (q * dt2) / 2;
  out.p11 = s.p11 + q * dt;
  return out;
}

/**
 * Measurement update from a prediction; `innovation` is already clipped by the caller.
 * Joseph-free form is fine here: the gain is the optimal one, and covariances are re-symmetrised by keeping
 * only (p00, p01, p11).
 */
export function update(s: FilterState, pr: Prediction, innovation: number, noiseVar: number): void {
  const S = pr.p00 + noiseVar;
  const k0 = pr.p00 / S;
  const k1 = pr.p01 / S;
  s.v = pr.v + k0 * innovation;
  s.r = s.r + k1 * innovation;
  s.p00 = pr.p00 * (1 - k0);
  s.p01 = pr.p01 * (1 - k0);
  s.p11 = Math.max(pr.p11 - k1 * pr.p01, 0);
}

/**
 * Measurement update with observation row H = [1, d]: the reading is the level plus the rate times d (the
 * use part of the daily profile, days). The same gain formula with H P H' + R as the innovation variance.
 */
export function updateShaped(
  s: FilterState,
  pr: Prediction,
  innovation: number,
  noiseVar: number,
  d: number,
): void {
  const a0 = pr.p00 + d * pr.p01;
  const a1 = pr.p01 + d * pr.p11;
  const S = a0 + d * a1 + noiseVar;
  const k0 = a0 / S;
  const k1 = a1 / S;
  s.v = pr.v + k0 * innovation;
  s.r = s.r + k1 * innovation;
  s.p00 = pr.p00 - k0 * a0;
  s.p01 = pr.p01 - k0 * a1;
  s.p11 = Math.max(pr.p11 - k1 * a1, 0);
}

/** A level shift (delivery, withdrawal): the volume restarts at `volume`, the rate and its variance carry on. */
export function reseedVolume(s: FilterState, pr: Prediction, volume: number, noiseVar: number): void {
  s.v = volume;
  s.p00 = noiseVar;
  s.p01 = 0;
  s.p11 = pr.p11;
}

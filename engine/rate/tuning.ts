// Tuning constants of the estimator, chosen by measurement on the accuracy bench (bench/accuracy).

export const DAY_MS = 86_400_000;
/** A reading this many predicted standard deviations off (and above the size floor) is not trusted at once. */
export const EVENT_Z = 4;
/** Smallest level shift counted as an event, as a fraction of capacity (or of the largest volume seen). */
export const EVENT_MIN_FRACTION = 0.02;
/** Huber clipping of innovations, in standard deviations. */
export const HUBER_C = 2.5;
/** Memory of the rate in days (the filter's time constant) and its floor in sampling intervals. */
export const RATE_MEMORY_DAYS = 1.5;
export const RATE_MEMORY_INTERVALS = 3;
/** Longest memory under heavy noise, and the relative rate precision the memory aims for. */
export const RATE_MEMORY_MAX_DAYS = 5;
export const RATE_TARGET_PRECISION = 0.03;
/** Two-sided CUSUM on standardised innovations (Page, 1954): allowance and alarm level. */
export const CUSUM_K = 0.5;
export const CUSUM_H = 4;
/** Residuals closer together than this are not independent evidence of a change (days). */
export const CUSUM_DECORRELATION_DAYS = 0.125;
/**
 * The slope check of dense series (slope-check.ts): once an hour of data, windows of SLOPE_MIN_DAYS to
 * SLOPE_WINDOW_DAYS (and SLOPE_MIN_READINGS readings) whose rate is more than SLOPE_MARGIN of the filter's
 * off by SLOPE_Z standard errors, while the CUSUM on that side is at least SLOPE_CUSUM (half its alarm).
 * Accuracy bench, hourly scenarios of the dense family on 10 seeds (328 rate changes): median lag 27.5 h
 * before, 26.4 h with a delivery keeping the change evidence (estimator.ts), 23.6 h with this check too
 * (rate error 3.1% / 3.5%). The shortest window: 12 h reached 23.4 h and 18 h 23.6 h, but both took a night
 * or a lighter weekend under working hours for a change (the rate fell to a quarter of the mean on the
 * weekend test in estimator.test.ts); from 20 h (0.85 day) a window holds a working day and most of a night,
 * and the test passes (0.85 / 0.9 / 0.95 / 1 day: 23.6 / 24.0 / 25.0 / 25.2 h).
 */
export const SLOPE_CHECK_EVERY_MS = 3_600_000;
export const SLOPE_WINDOW_DAYS = 2;
export const SLOPE_MIN_DAYS = 0.85;
export const SLOPE_MIN_READINGS = 6;
export const SLOPE_MARGIN = 0.35;
export const SLOPE_Z = 0.5;
export const SLOPE_CUSUM = 2;
/**
 * A level shift explains a slope check's window when its F ratio on one parameter is past this. Without the
 * test a noisy 5-minute tank of test/rate-accuracy.test.ts made 13 false deliveries (so it did with 1000);
 * 10 vetoed real changes too (the fall to 0.4 in estimator.test.ts took 31 h, not 24); 30 and 100 gave
 * 25.2 and 25.4 h on the ten seeds' hourly lag with day-long windows.
 */
export const SLOPE_STEP_F = 30;
/** Below this mean sampling interval a series is dense (a sensor), above it manual. */
export const DENSE_INTERVAL_DAYS = 2 / 24;
/**
 * On sparse readings a rise above the last reading by this fraction of capacity is a delivery whatever the
 * noise estimate says: use never raises the level, and no dip is a tenth of the tank off. Chosen on the
 * accuracy bench (0.05-0.15 score alike over 13 seeds).
 */
export const SPARSE_RISE_FRACTION = 0.1;
/**
 * From this mean sampling interval on, readings are a crew's dips (a day or more apart, at most about two a
 * day): the checks that weigh the next dip against the one before apply. A 6-hourly sensor is sparse for the
 * event logic above but not manual.
 */
export const MANUAL_INTERVAL_DAYS = 0.5;
/**
 * Manual dips (interval-rates.ts): a change of use when INTERVAL_RATE_AGREE of the last INTERVAL_RATE_KEPT
 * intervals between dips lie beyond INTERVAL_RATE_Z standard deviations on the same side of the filter's
 * rate. Intervals shorter than INTERVAL_MIN_DAYS say little against the working-hour swing; the new rate's
 * variance is widened by INTERVAL_RATE_WIDEN (the intervals share the weekday and working-hour pattern).
 * Chosen on the accuracy bench (the manual family of bench/accuracy/manual-seeds.ts); 2-3 sd, 3 of 4 and a
 * widening of 4-16 score alike there.
 */
export const INTERVAL_RATE_Z = 2.5;
export const INTERVAL_RATE_KEPT = 4;
export const INTERVAL_RATE_AGREE = 3;
export const INTERVAL_MIN_DAYS = 0.5;
export const INTERVAL_RATE_WIDEN = 4;
/**
 * A delivery is logged at most this long after the reading that already showed it (a judgement, not a
 * measurement): a log entered later is another truck, not the rise seen before it.
 */
export const LOGGED_LATE_MS = 12 * 3_600_000;
/** Deviant readings waited on before a level shift is accepted regardless. */
export const MAX_PENDING = 8;
/** z of a two-sided 80% normal interval (1.2816, standard normal table). */
export const Z80 = 1.2815515655446004;
/**
 * The filter treats readings as independent; dense ones are not (thermal swing, working hours), so readings
 * closer together than RATE_SIGMA_CORRELATION_DAYS count as one: the effective number of readings is
 * count * interval / that time, and the rate's standard error is widened by sqrt(that time / interval) (the
 * usual effective-sample-size correction for correlated data). The time was calibrated on the accuracy bench
 * over six scenario seeds (pooled), so the ~80% range covers about 80% at every sampling interval.
 */
export const RATE_SIGMA_CORRELATION_DAYS = 0.375;
/** A rate change must settle for this long before it is reported. */
export const CHANGE_SETTLE_DAYS = 1;
/** Widening of a least-squares refit's covariance after a change (its residuals are not independent). */
export const RELEARN_WIDEN = 1;
/** Trusted readings kept for a refit after a change alarm (days back, at least). */
export const RECENT_KEEP_DAYS = 3;
/** Memory of each hour's mean in the daily profile of dense series, days. */
export const PROFILE_MEMORY_DAYS = 3;
/**
 * Share of what the daily profile learns that is taken as use, which scales with the rate (working hours);
 * the rest stays in litres (a thermal swing). While the rate holds the two are one pattern and no reading
 * tells them apart, so this is a prior. Accuracy bench, dense families of 14 seeds (about 450 rate changes
 * per sampling interval), median lag at 5 min / 15 min / hourly: 0 (all in litres, as before) 28.6 / 23.8 /
 * 28.7 h, 0.5 28.7 / 24.1 / 26.5 h, 1 (all as use) 31.1 / 24.9 / 26.6 h with a lower delivery F1 (0.985
 * against 0.991 on 6 of the seeds).
 */
export const USE_PROFILE_SHARE = 0.5;
/** Readings above this are refused: the largest storage tanks hold about 1e8 L (from memory), far below. */
export const MAX_VOLUME_LITRES = 1e12;

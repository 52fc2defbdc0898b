// The per-tank consumption-rate estimator: a robust local-linear-trend Kalman filter (kalman.ts) with level-
// shift interventions for deliveries and bulk withdrawals, a confirmation step that tells a real shift (it
// persists) from a typo or spike (it does not), and two-sided CUSUM change detection that lets the rate
// re-learn. Level shifts as interventions: Harvey, Koopman & Penzer, "Messy time series" (1998). CUSUM:
// E. S. Page, "Continuous inspection schemes", Biometrika 41 (1954). Causal by construction: each reading
// is processed once, in order, and its point is never revised.
import { eventTypeFor, findNearbyEvent, loggedShift, loggedTypeFor, pushEvent } from './events.js';
import { type Prediction, predict, reseedVolume, update } from './kalman.js';
import { pointFrom, rejectedPoint } from './point.js';
import { bestSplit, clearRecent, fitRecent, pushRecent, trimRecent } from './recent.js';
import { deviationReason, unitSlipReason } from './suspect.js';
import * as tuning from './tuning.js';
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

// Copied once into local constants: the hot path then reads plain values, not module bindings.
const {
  CHANGE_SETTLE_DAYS,
  CUSUM_DECORRELATION_DAYS,
  CUSUM_H,
  CUSUM_K,
  DAY_MS,
  DENSE_INTERVAL_DAYS,
  EVENT_MIN_FRACTION,
  EVENT_Z,
  HUBER_C,
  MAX_PENDING,
  PROFILE_MEMORY_DAYS,
  RATE_MEMORY_DAYS,
  RATE_MEMORY_INTERVALS,
  RATE_MEMORY_MAX_DAYS,
  RATE_TARGET_PRECISION,
  RECENT_KEEP_DAYS,
  RELEARN_WIDEN,
} = tuning;

/** Bumped whenever the state's shape or meaning changes (2: recent readings kept for refits; 3: daily profile). */
export const RATE_STATE_VERSION = 3;

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
    pending: [],
    undo: null,
    loggedPending: [],
    changePending: null,
    lastPoint: null,
    events: [],
    changes: [],
    suspects: [],
  };
}

const hourOfDay = (time: number) => Math.floor((((time % DAY_MS) + DAY_MS) % DAY_MS) / 3_600_000);

export class Estimator implements RateEstimator {
  private readonly pr: Prediction = { v: 0, p00: 0, p01: 0, p11: 0 };

  constructor(private readonly s: RateEstimatorState) {}

  get events(): readonly TankEvent[] {
    return this.s.events;
  }
  get changes(): readonly RateChange[] {
    return this.s.changes;
  }
  get suspects(): readonly SuspectReading[] {
    return this.s.suspects;
  }

  toJSON(): RateEstimatorState {
    return structuredClone(this.s);
  }

  addDelivery(time: number, volumeLitres: number): void {
    const s = this.s;
    if (!Number.isFinite(time) || !(volumeLitres > 0) || !Number.isFinite(volumeLitres)) return;
    const type = loggedTypeFor(s.filling);
    const found = findNearbyEvent(s.events, type, time, this.loggedWindowMs());
    if (found >= 0) {
      s.events[found]!.logged = true;
      return;
    }
    s.loggedPending.push({ time, volume: volumeLitres });
  }

  addReading(time: number, reading: number): RatePoint {
    const s = this.s;
    const problem = this.rejectReason(time, reading);
    if (problem) {
      if (Number.isFinite(time)) s.suspects.push({ time, reason: problem });
      return rejectedPoint(s.lastPoint, time, problem);
    }
    s.count++;
    if (reading > s.scale) s.scale = reading;
    const volume = reading - this.profileAt(time);
    if (s.lastTime === null) return this.start(time, volume);
    this.trackInterval(time);
    const R = this.noiseVar();
    let pr = this.predictTo(time, R);
    let e = volume - pr.v;
    let deviant = Math.abs(e) > this.threshold(pr, R);

    if (s.undo) {
      const undo = s.undo;
      s.undo = null;
      if (deviant && this.revertIfTypo(undo, time, volume, R)) {
        pr = this.predictTo(time, R);
        e = volume - pr.v;
        deviant = Math.abs(e) > this.threshold(pr, R);
      }
    }

    if (s.pending.length > 0) {
      if (deviant) return this.continuePending(time, volume, pr, R);
      this.dropPendingAsSuspect();
    } else if (deviant) {
      const logged = this.takeLogged(time, e);
      const refillSign = s.filling ? -1 : 1;
      const sparse = s.dtMean >= DENSE_INTERVAL_DAYS;
      if (logged || (sparse && Math.sign(e) === refillSign && !unitSlipReason(volume, pr.v))) {
        s.undo = logged ? null : this.undoSnapshot(time, volume);
        const start = logged ? logged.time : (s.lastTime + time) / 2;
        this.acceptShift(time, volume, pr, R, start, time, logged !== null);
        return this.point(time, undefined);
      }
      s.pending.push({ time, volume });
      return this.pendingPoint(time, pr, deviationReason(volume, pr.v));
    }
    e = this.applySmallLogged(time, e, pr);
    this.filterUpdate(time, volume, e, pr, R);
    return this.point(time, undefined);
  }

  // --- steps --------------------------------------------------------------------------------------------

  private rejectReason(time: number, volume: number): string | null {
    const s = this.s;
    if (!Number.isFinite(time)) return 'the time is not a valid instant';
    if (!Number.isFinite(volume)) return 'the volume is not a number';
    if (volume < 0) return 'a volume below zero';
    const latest = s.pending.length > 0 ? s.pending[s.pending.length - 1]!.time : s.lastTime;
    if (latest !== null && time < latest) return 'earlier than a reading already used';
    if (s.capacity !== null && volume > s.capacity * 1.05) {
      return `${Math.round(volume)} L is above the tank capacity of ${Math.round(s.capacity)} L`;
    }
    return null;
  }

  private start(time: number, volume: number): RatePoint {
    const s = this.s;
    const scale = Math.max(s.scale, 1);
    s.lastTime = time;
    s.v = volume;
    s.r = 0;
    s.p00 = (0.003 * scale) ** 2;
    s.p01 = 0;
    // A vague prior on the rate: anything up to the whole tank a day.
    s.p11 = scale * scale;
    s.innovationVar = s.p00;
    s.basisStart = time;
    s.basisCount = s.count;
    return this.point(time, undefined);
  }

  /** Running mean of the sampling interval; a long outage is clipped so it does not make a sensor "manual". */
  private trackInterval(time: number): void {
    const s = this.s;
    const prev = s.pending.length > 0 ? s.pending[s.pending.length - 1]!.time : s.lastTime!;
    const gap = (time - prev) / DAY_MS;
    if (gap <= 0) return;
    if (s.dtMean === 0) s.dtMean = gap;
    else s.dtMean += 0.1 * (Math.min(gap, 4 * s.dtMean) - s.dtMean);
  }

  /** Measurement noise: mean squared innovation less the prediction's own variance, with a small floor. */
  private noiseVar(): number {
    const s = this.s;
    const floor = (1e-4 * Math.max(s.scale, 1)) ** 2;
    return Math.max(s.innovationVar - s.p00, floor);
  }

  private predictTo(time: number, R: number): Prediction {
    const s = this.s;
    const dt = (time - s.lastTime!) / DAY_MS;
    // Rate noise sized so the filter's memory is about `memory` days whatever the sampling: for an integrated
    // random walk the steady-state bandwidth is (q / (R dt))^(1/4) per day.
    // Under heavy noise or very slow use the memory grows (up to RATE_MEMORY_MAX_DAYS) until the rate's
    // steady-state error, about sqrt(2 R dt / T^3), is near RATE_TARGET_PRECISION of the rate.
    const wanted = RATE_TARGET_PRECISION * Math.abs(s.r) + 1e-6 * s.scale;
    const quiet = Math.cbrt((2 * R * s.dtMean) / (wanted * wanted));
    const memory = Math.max(
      RATE_MEMORY_DAYS,
      RATE_MEMORY_INTERVALS * s.dtMean,
      Math.min(RATE_MEMORY_MAX_DAYS, quiet),
    );
    const q = (R * s.dtMean) / memory ** 4;
    return predict(s, dt, q, this.pr);
  }

  private threshold(pr: Prediction, R: number): number {
    const s = this.s;
    return Math.max(EVENT_Z * Math.sqrt(pr.p00 + R), EVENT_MIN_FRACTION * (s.capacity ?? s.scale));
  }

  private filterUpdate(time: number, volume: number, e: number, pr: Prediction, R: number): void {
    const s = this.s;
    const S = pr.p00 + R;
    const sd = Math.sqrt(S);
    const z = Math.max(-EVENT_Z, Math.min(EVENT_Z, e / sd));
    const clipped = Math.max(-HUBER_C * sd, Math.min(HUBER_C * sd, e));
    const before = s.r;
    const alpha = Math.max(1 / s.count, 0.02);
    s.innovationVar += alpha * (Math.min(e * e, EVENT_Z * EVENT_Z * S) - s.innovationVar);
    const dt = (time - s.lastTime!) / DAY_MS;
    update(s, pr, clipped, R);
    s.lastTime = time;
    // Dense readings are not independent (thermal swing, working hours): each counts for at most its share
    // of the decorrelation time, so a sensor every 5 minutes does not raise an alarm 72 times sooner.
    pushRecent(s, time, volume);
    this.learnProfile(time, volume, dt);
    this.detectChange(time, z, before, Math.min(1, dt / CUSUM_DECORRELATION_DAYS));
    trimRecent(s, Math.min(s.cusumPosStart, s.cusumNegStart, time - RECENT_KEEP_DAYS * DAY_MS));
  }

  /**
   * A daily shape (working hours, thermal swing) would otherwise pass for rate changes. Dense series learn
   * the level's mean deviation per hour of day (each hour's memory about PROFILE_MEMORY_DAYS) and readings
   * are taken net of it: a seasonal adjustment in the spirit of the structural model's daily seasonal
   * (Harvey 1989, ch. 2), kept as 24 running means instead of extra filter states for speed.
   */
  private profileAt(time: number): number {
    const s = this.s;
    if (s.dtMean === 0 || s.dtMean >= DENSE_INTERVAL_DAYS) return 0;
    const profile = s.dailyProfile;
    let mean = 0;
    for (let i = 0; i < 24; i++) mean += profile[i]!;
    return profile[hourOfDay(time)]! - mean / 24;
  }

  private learnProfile(time: number, volume: number, dt: number): void {
    const s = this.s;
    if (s.dtMean >= DENSE_INTERVAL_DAYS || dt <= 0) return;
    const profile = s.dailyProfile;
    const bin = hourOfDay(time);
    // The reading was taken net of the profile; the deviation left after filtering adds to this hour's mean.
    const weight = Math.min(0.3, (24 * dt) / PROFILE_MEMORY_DAYS);
    profile[bin] = profile[bin]! + weight * (volume - s.v);
  }

  /** Two-sided CUSUM on standardised innovations; an alarm widens the rate's variance so it re-learns. */
  private detectChange(time: number, z: number, before: number, weight: number): void {
    const s = this.s;
    if (s.cusumPos === 0) s.cusumPosStart = time;
    if (s.cusumNeg === 0) s.cusumNegStart = time;
    s.cusumPos = Math.max(0, s.cusumPos + weight * (z - CUSUM_K));
    s.cusumNeg = Math.max(0, s.cusumNeg + weight * (-z - CUSUM_K));
    if (s.cusumPos > CUSUM_H || s.cusumNeg > CUSUM_H) {
      const at = s.cusumPos > CUSUM_H ? s.cusumPosStart : s.cusumNegStart;
      this.relearn(at, time);
      if (!s.changePending) s.changePending = { at, from: before, alarm: time, count: s.count };
      this.resetCusum();
    }
    const pendingChange = s.changePending;
    if (
      pendingChange &&
      time - pendingChange.alarm >= CHANGE_SETTLE_DAYS * DAY_MS &&
      s.count - pendingChange.count >= 3
    ) {
      const { at, from } = pendingChange;
      if (Math.abs(s.r - from) > 0.2 * Math.max(Math.abs(from), Math.abs(s.r))) {
        s.changes.push({ at, from, to: s.r });
      }
      s.changePending = null;
    }
  }

  /**
   * After an alarm: refit level and rate by least squares on the readings since the change began (widened,
   * since those residuals are not independent); with too few, forget the old rate instead.
   */
  private relearn(at: number, time: number): number {
    const s = this.s;
    const R = this.noiseVar();
    const split = bestSplit(s, time, 4);
    const from = split ?? at;
    const fit = fitRecent(s, from, time, R);
    if (fit) {
      s.v = fit.v;
      s.r = fit.r;
      s.p00 = fit.p00 * RELEARN_WIDEN;
      s.p01 = fit.p01 * RELEARN_WIDEN;
      s.p11 = fit.p11 * RELEARN_WIDEN;
      s.basisCount = s.count - fit.count + 1;
    } else {
      s.p11 += (Math.abs(s.r) + 1e-3 * Math.max(s.scale, 1)) ** 2;
      s.p00 += 4 * R;
      s.p01 = 0;
      s.basisCount = s.count;
    }
    s.basisStart = from;
    return from;
  }

  private resetCusum(): void {
    this.s.cusumPos = 0;
    this.s.cusumNeg = 0;
  }

  /** Deviant readings after a deviant one: a shift is real once two in a row agree with each other. */
  private continuePending(time: number, volume: number, pr: Prediction, R: number): RatePoint {
    const s = this.s;
    const prev = s.pending[s.pending.length - 1]!;
    s.pending.push({ time, volume });
    const dt = (time - prev.time) / DAY_MS;
    const step = volume - (prev.volume - s.r * dt);
    const tolerance = EVENT_Z * Math.sqrt(2 * R + dt * dt * pr.p11);
    const sameSide =
      Math.sign(prev.volume - (pr.v + s.r * ((time - prev.time) / DAY_MS))) === Math.sign(volume - pr.v);
    const first = s.pending[0]!;
    if (sameSide && this.looksLikeRateChange(first, prev, volume, dt)) {
      this.absorbAsRateChange(time);
      return this.point(time, undefined);
    }
    if ((Math.abs(step) < tolerance && sameSide) || s.pending.length >= MAX_PENDING) {
      const logged = this.takeLogged(time, volume - pr.v);
      const start = logged ? logged.time : (s.lastTime! + first.time) / 2;
      const end = s.pending.length >= 2 ? prev.time : time;
      s.pending = [];
      this.acceptShift(time, volume, pr, R, start, end, logged !== null);
      return this.point(time, undefined);
    }
    return this.pendingPoint(time, pr, deviationReason(volume, pr.v));
  }

  /**
   * On sparse readings a faster (or slower) use also leaves the level off its prediction, in the direction of
   * use. A step is a withdrawal when the next interval goes on at the old rate, a rate change when it goes on
   * at the rate the first deviation implies.
   */
  private looksLikeRateChange(first: TimedVolume, prev: TimedVolume, volume: number, dt: number): boolean {
    const s = this.s;
    if (s.dtMean < DENSE_INTERVAL_DAYS || s.pending.length !== 2) return false;
    const refillSign = s.filling ? -1 : 1;
    const firstDt = (first.time - s.lastTime!) / DAY_MS;
    const deviation = first.volume - (s.v - s.r * firstDt);
    if (Math.sign(deviation) === refillSign || firstDt <= 0) return false;
    const implied = s.r - deviation / firstDt;
    const oldError = Math.abs(volume - (prev.volume - s.r * dt));
    const newError = Math.abs(volume - (prev.volume - implied * dt));
    return newError < oldError;
  }

  /** Feeds the waiting readings to the filter after forgetting the rate, and marks a change. */
  private absorbAsRateChange(time: number): void {
    const s = this.s;
    const readings = s.pending;
    s.pending = [];
    const from = s.r;
    const at = s.lastTime!;
    const first = readings[0]!;
    const firstDt = Math.max((first.time - at) / DAY_MS, 1e-9);
    const deviation = first.volume - (s.v - s.r * firstDt);
    s.p11 += (deviation / firstDt) ** 2;
    s.p01 = 0;
    for (const r of readings) {
      const R = this.noiseVar();
      const pr = this.predictTo(r.time, R);
      this.filterUpdate(r.time, r.volume, r.volume - pr.v, pr, R);
    }
    this.resetCusum();
    s.basisStart = at;
    s.basisCount = s.count - readings.length + 1;
    if (!s.changePending) s.changePending = { at, from, alarm: time, count: s.count };
  }

  private acceptShift(
    time: number,
    level: number,
    pr: Prediction,
    R: number,
    start: number,
    end: number,
    logged: boolean,
  ): void {
    const s = this.s;
    const shift = level - pr.v;
    const mergeWindow = Math.max(2 * 3_600_000, 2 * s.dtMean * DAY_MS);
    pushEvent(
      s.events,
      { type: eventTypeFor(shift, s.filling), start, end, volume: Math.abs(shift), logged },
      s.dtMean < DENSE_INTERVAL_DAYS ? mergeWindow : 0,
    );
    reseedVolume(s, pr, level, R);
    s.lastTime = time;
    this.resetCusum();
    clearRecent(s);
  }

  private dropPendingAsSuspect(): void {
    const s = this.s;
    for (const p of s.pending) {
      const expected = s.v - (s.r * (p.time - s.lastTime!)) / DAY_MS;
      s.suspects.push({ time: p.time, reason: deviationReason(p.volume, expected) });
    }
    s.pending = [];
  }

  private undoSnapshot(time: number, volume: number): RateEstimatorState['undo'] {
    const s = this.s;
    const last = s.events[s.events.length - 1];
    return {
      time,
      volume,
      lastTime: s.lastTime!,
      v: s.v,
      r: s.r,
      p00: s.p00,
      p01: s.p01,
      p11: s.p11,
      eventCount: s.events.length,
      previousEvent: last ? { ...last } : null,
    };
  }

  /** A shift accepted at once that the very next reading contradicts was a typo: restore the filter. */
  private revertIfTypo(
    undo: NonNullable<RateEstimatorState['undo']>,
    time: number,
    volume: number,
    R: number,
  ): boolean {
    const s = this.s;
    const dt = (time - undo.lastTime) / DAY_MS;
    const expected = undo.v - undo.r * dt;
    const sd = Math.sqrt(undo.p00 - 2 * dt * undo.p01 + dt * dt * undo.p11 + R);
    if (Math.abs(volume - expected) > Math.max(EVENT_Z * sd, 0)) return false;
    if (Math.abs(volume - expected) * 2 > Math.abs(volume - s.v)) return false;
    s.lastTime = undo.lastTime;
    s.v = undo.v;
    s.r = undo.r;
    s.p00 = undo.p00;
    s.p01 = undo.p01;
    s.p11 = undo.p11;
    s.events.length = undo.eventCount;
    if (undo.previousEvent && undo.eventCount > 0) s.events[undo.eventCount - 1] = undo.previousEvent;
    s.suspects.push({
      time: undo.time,
      reason: deviationReason(undo.volume, undo.v - (undo.r * (undo.time - undo.lastTime)) / DAY_MS),
    });
    return true;
  }

  private loggedWindowMs(): number {
    return Math.max(12 * 3_600_000, 2 * this.s.dtMean * DAY_MS);
  }

  /** A logged delivery due by `time` whose direction matches the shift `e`, removed from the waiting list. */
  private takeLogged(time: number, e: number): TimedVolume | null {
    const s = this.s;
    const window = this.loggedWindowMs();
    const index = s.loggedPending.findIndex(
      (l) => l.time <= time + window && Math.sign(loggedShift(l.volume, s.filling)) === Math.sign(e),
    );
    if (index < 0) return null;
    return s.loggedPending.splice(index, 1)[0]!;
  }

  /**
   * Logged deliveries too small to see as a shift: applied when the reading agrees better with them; given up
   * (kept as a logged event, no shift) when the data show nothing within the window.
   */
  private applySmallLogged(time: number, e: number, pr: Prediction): number {
    const s = this.s;
    let innovation = e;
    for (let i = 0; i < s.loggedPending.length; ) {
      const l = s.loggedPending[i]!;
      if (l.time > time) {
        i++;
        continue;
      }
      const shift = loggedShift(l.volume, s.filling);
      const type = loggedTypeFor(s.filling);
      if (Math.abs(innovation - shift) < Math.abs(innovation)) {
        pr.v += shift;
        innovation -= shift;
        s.events.push({ type, start: l.time, end: l.time, volume: l.volume, logged: true });
        s.loggedPending.splice(i, 1);
      } else if (time - l.time > this.loggedWindowMs()) {
        s.events.push({ type, start: l.time, end: l.time, volume: l.volume, logged: true });
        s.loggedPending.splice(i, 1);
      } else i++;
    }
    return innovation;
  }

  private pendingPoint(time: number, pr: Prediction, reason: string): RatePoint {
    const s = this.s;
    const p = pointFrom(s, time, pr.v, pr.p11, reason);
    s.lastPoint = p;
    return p;
  }

  private point(time: number, reason: string | undefined): RatePoint {
    const s = this.s;
    const p = pointFrom(s, time, s.v, s.p11, reason);
    s.lastPoint = p;
    return p;
  }
}

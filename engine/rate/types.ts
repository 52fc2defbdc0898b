// The public shapes of the consumption-rate estimator (engine units: litres, epoch ms, litres/day).

export interface RateOptions {
  /** Tank capacity in litres: enables %-based thresholds and event size limits. */
  capacity?: number;
  /** A filling tank (waste, produced water, used oil): rises are use, drops are pick-ups. */
  filling?: boolean;
}

export interface RatePoint {
  time: number;
  /** Filtered volume, litres. */
  volume: number;
  /** Consumption rate, litres/day, positive while emptying; an ~80% range and its standard error. */
  rate: number;
  rateLow: number;
  rateHigh: number;
  rateSigma: number;
  /** Why this reading was not trusted (typo, unit slip, spike, not confirmed yet). */
  suspect?: string;
  /** How many readings, over how many days, the current rate rests on. */
  readings: number;
  basisDays: number;
}

export type TankEventType = 'delivery' | 'withdrawal' | 'pickup';

export interface TankEvent {
  type: TankEventType;
  start: number;
  end: number;
  /** Litres moved, always positive. */
  volume: number;
  logged: boolean;
}

export interface RateChange {
  at: number;
  from: number;
  to: number;
}

export interface SuspectReading {
  time: number;
  reason: string;
}

export interface RateEstimator {
  addReading(time: number, volumeLitres: number): RatePoint;
  /** A delivery someone logged (or a pick-up on a filling tank), litres. */
  addDelivery(time: number, volumeLitres: number): void;
  readonly events: readonly TankEvent[];
  readonly changes: readonly RateChange[];
  /** Readings found untrustworthy so far (confirmed spikes, typos, unit slips). */
  readonly suspects: readonly SuspectReading[];
  toJSON(): RateEstimatorState;
}

export interface TimedVolume {
  time: number;
  volume: number;
}

/** Everything the estimator knows, as plain JSON: restoring it resumes exactly. */
export interface RateEstimatorState {
  /** RATE_STATE_VERSION when written; a state of another version must be rebuilt from the readings. */
  version: number;
  capacity: number | null;
  filling: boolean;
  /** Readings seen (valid ones). */
  count: number;
  /** Time of the last trusted reading (the filter's time), or null before the first. */
  lastTime: number | null;
  /** Filter state: volume (L), rate (L/day) and their covariance. */
  v: number;
  r: number;
  p00: number;
  p01: number;
  p11: number;
  /** Running mean of squared innovations (L^2) and of the sampling interval (days). */
  innovationVar: number;
  dtMean: number;
  /** Largest volume seen: a capacity proxy when no capacity is given. */
  scale: number;
  cusumPos: number;
  cusumNeg: number;
  cusumPosStart: number;
  cusumNegStart: number;
  basisStart: number;
  basisCount: number;
  /** Trusted readings since the change detector last had no evidence (for a refit on an alarm). */
  recentTimes: number[];
  recentVolumes: number[];
  /** Dense series: the level's mean deviation by hour of day (UTC) in litres, taken out before filtering. */
  dailyProfile: number[];
  /** Sum of dailyProfile, kept so the zero-mean profile costs O(1) per reading. */
  dailyProfileSum: number;
  /** The deviation's use part per unit rate (days; the rate times it is litres), and its sum. */
  useProfile: number[];
  useProfileSum: number;
  /** Deviant readings since the last trusted one, waiting for confirmation. */
  pending: TimedVolume[];
  /** Filter state before an event accepted at once, kept one reading in case it was a typo. */
  undo: UndoState | null;
  /** Filter state before sparse readings were taken as a rate change, kept one reading in case of a shift. */
  rateUndo: RateChangeUndo | null;
  loggedPending: TimedVolume[];
  /** Manual dips: the previous dip (trusted or not), litres logged since it, and the recent intervals. */
  previousDip: TimedVolume | null;
  loggedSinceDip: number;
  dipIntervals: DipInterval[];
  changePending: { at: number; from: number; alarm: number; count: number } | null;
  events: TankEvent[];
  changes: RateChange[];
  suspects: SuspectReading[];
}

/** Use between two consecutive dips with no rise between them: from when, over how many days, litres. */
export interface DipInterval {
  from: number;
  days: number;
  use: number;
}

/** The filter as it was at its last trusted reading, kept to go back to. */
export interface FilterSnapshot {
  lastTime: number;
  v: number;
  r: number;
  p00: number;
  p01: number;
  p11: number;
}

export interface UndoState extends FilterSnapshot {
  /** The noise estimate before the reading kept in doubt. */
  innovationVar: number;
  time: number;
  volume: number;
  eventCount: number;
  previousEvent: TankEvent | null;
}

export interface RateChangeUndo extends FilterSnapshot {
  innovationVar: number;
  basisStart: number;
  basisCount: number;
  changePending: RateEstimatorState['changePending'];
  /** Length of `changes` before. */
  changeCount: number;
  /** The deviant readings taken as the change. */
  readings: TimedVolume[];
}

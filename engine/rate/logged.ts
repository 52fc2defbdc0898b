// Deliveries someone logged (pick-ups on a filling tank): matched with a shift seen in the data, applied when
// too small to see, or kept as a logged event when the data show nothing.
import { findNearbyEvent, loggedShift, loggedTypeFor } from './events.js';
import type { Prediction } from './kalman.js';
import * as tuning from './tuning.js';
import type { RateEstimatorState, TimedVolume } from './types.js';

const { DAY_MS } = tuning;

export function loggedWindowMs(s: RateEstimatorState): number {
  return Math.max(12 * 3_600_000, 2 * s.dtMean * DAY_MS);
}

/** Marks a detected event near `time` as logged, or keeps the delivery waiting for the readings. */
export function registerLogged(s: RateEstimatorState, time: number, volume: number): void {
  const found = findNearbyEvent(s.events, loggedTypeFor(s.filling), time, loggedWindowMs(s));
  if (found >= 0) s.events[found]!.logged = true;
  else s.loggedPending.push({ time, volume });
}

/** A logged delivery due by `time` whose direction matches the shift `e`, removed from the waiting list. */
export function takeLogged(s: RateEstimatorState, time: number, e: number): TimedVolume | null {
  const window = loggedWindowMs(s);
  const index = s.loggedPending.findIndex(
    (l) => l.time <= time + window && Math.sign(loggedShift(l.volume, s.filling)) === Math.sign(e),
  );
  if (index < 0) return null;
  return s.loggedPending.splice(index, 1)[0]!;
}

/**
 * Logged deliveries too small to see as a shift: applied (to the prediction `pr`) when the reading agrees
 * better with them; given up (kept as a logged event, no shift) when the data show nothing within the window.
 * Returns the innovation left.
 */
export function applySmallLogged(s: RateEstimatorState, time: number, e: number, pr: Prediction): number {
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
    } else if (time - l.time > loggedWindowMs(s)) {
      s.events.push({ type, start: l.time, end: l.time, volume: l.volume, logged: true });
      s.loggedPending.splice(i, 1);
    } else i++;
  }
  return innovation;
}

// Deliveries someone logged (pick-ups on a filling tank): matched with a shift seen in the data, applied when
// too small to see, or kept as a logged event when the data show nothing.
import { findNearbyEvent, loggedShift, loggedTypeFor } from './events.js';
import type { Prediction } from './kalman.js';
import * as tuning from './tuning.js';
import type { RateEstimatorState, TankEvent, TimedVolume } from './types.js';

const { DAY_MS, LOGGED_LATE_MS } = tuning;

export function loggedWindowMs(s: RateEstimatorState): number {
  return Math.max(12 * 3_600_000, 2 * s.dtMean * DAY_MS);
}

/**
 * Marks a detected event as logged when it is this delivery, or keeps the delivery waiting for the readings.
 * An event the readings showed more than LOGGED_LATE_MS before the logged time is another truck (on dips
 * days apart the window would otherwise reach back to the previous delivery).
 */
export function registerLogged(s: RateEstimatorState, time: number, volume: number): void {
  const window = loggedWindowMs(s);
  const type = loggedTypeFor(s.filling);
  const found = findNearbyEvent(s.events, type, time, window, Math.min(window, LOGGED_LATE_MS));
  if (found >= 0) s.events[found]!.logged = true;
  else s.loggedPending.push({ time, volume });
}

/**
 * The logged delivery a shift `e` seen by `time` stands for, removed from the waiting list: the latest one
 * due by then in its direction (an older one still waiting was too small to see, or is given up later).
 */
export function takeLogged(s: RateEstimatorState, time: number, e: number): TimedVolume | null {
  const window = loggedWindowMs(s);
  const index = s.loggedPending.findLastIndex(
    (l) => l.time <= time + window && Math.sign(loggedShift(l.volume, s.filling)) === Math.sign(e),
  );
  if (index < 0) return null;
  return s.loggedPending.splice(index, 1)[0]!;
}

/**
 * The events with the logged deliveries still waiting for the readings (logged after the last reading, or
 * not yet matched) as logged events at their logged time: a logged delivery is an event from the start.
 */
export function eventsOf(s: RateEstimatorState): readonly TankEvent[] {
  if (s.loggedPending.length === 0) return s.events;
  const type = loggedTypeFor(s.filling);
  const waiting = s.loggedPending.map((l) => ({
    type,
    start: l.time,
    end: l.time,
    volume: l.volume,
    logged: true,
  }));
  return [...s.events, ...waiting];
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

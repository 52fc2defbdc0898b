// A rise accepted at once on sparse readings (a delivery) keeps the filter as it was for one reading: if the
// very next reading contradicts the rise, it was a typo, and the filter goes back. On manual dips the first
// interval is kept the same way: alone it sets the rate, so a typo in the second dip would set a wild one.
import { loggedShift } from './events.js';
import { deviationReason } from './suspect.js';
import * as tuning from './tuning.js';
import type { FilterSnapshot, RateEstimatorState, UndoState } from './types.js';

const { DAY_MS, EVENT_Z } = tuning;

export function filterSnapshot(s: RateEstimatorState): FilterSnapshot {
  return { lastTime: s.lastTime!, v: s.v, r: s.r, p00: s.p00, p01: s.p01, p11: s.p11 };
}

export function restoreFilter(s: RateEstimatorState, snapshot: FilterSnapshot): void {
  s.lastTime = snapshot.lastTime;
  s.v = snapshot.v;
  s.r = snapshot.r;
  s.p00 = snapshot.p00;
  s.p01 = snapshot.p01;
  s.p11 = snapshot.p11;
}

export function undoSnapshot(s: RateEstimatorState, time: number, volume: number): UndoState {
  const last = s.events[s.events.length - 1];
  return {
    lastTime: s.lastTime!,
    v: s.v,
    r: s.r,
    p00: s.p00,
    p01: s.p01,
    p11: s.p11,
    innovationVar: s.innovationVar,
    time,
    volume,
    eventCount: s.events.length,
    previousEvent: last ? { ...last } : null,
  };
}

/**
 * Restores the filter when `volume` agrees with the state before the accepted rise far better than with
 * `kept`, the level expected if the rise was real; says whether it did. Deliveries logged since the rise
 * count on both sides. A sensor's next reading must also sit on the line before the rise; a manual dip comes
 * a day or more later, when that line may have bent (a withdrawal, a change of use), so there the comparison
 * of the two alone decides.
 */
export function revertIfTypo(
  s: RateEstimatorState,
  undo: UndoState,
  time: number,
  volume: number,
  R: number,
  kept: number,
  manual: boolean,
): boolean {
  const dt = (time - undo.lastTime) / DAY_MS;
  const logged = loggedSince(s, undo.time, time);
  const expected = undo.v - undo.r * dt + logged;
  const sd = Math.sqrt(undo.p00 - 2 * dt * undo.p01 + dt * dt * undo.p11 + R);
  if (!manual && Math.abs(volume - expected) > Math.max(EVENT_Z * sd, 0)) return false;
  if (Math.abs(volume - expected) * 2 > Math.abs(volume - (kept + logged))) return false;
  restoreFilter(s, undo);
  // The rise's innovation was no measure of the noise.
  s.innovationVar = undo.innovationVar;
  s.events.length = undo.eventCount;
  if (undo.previousEvent && undo.eventCount > 0) s.events[undo.eventCount - 1] = undo.previousEvent;
  s.suspects.push({
    time: undo.time,
    reason: deviationReason(undo.volume, undo.v - (undo.r * (undo.time - undo.lastTime)) / DAY_MS),
  });
  return true;
}

/** The level change of the logged deliveries still waiting that were logged in (from, to]. */
function loggedSince(s: RateEstimatorState, from: number, to: number): number {
  let sum = 0;
  for (const l of s.loggedPending) if (l.time > from && l.time <= to) sum += loggedShift(l.volume, s.filling);
  return sum;
}

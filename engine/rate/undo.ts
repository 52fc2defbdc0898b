// A rise accepted at once on sparse readings (a delivery) keeps the filter as it was for one reading: if the
// very next reading contradicts the rise, it was a typo, and the filter goes back.
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
    ...filterSnapshot(s),
    time,
    volume,
    eventCount: s.events.length,
    previousEvent: last ? { ...last } : null,
  };
}

/** Restores the filter when `volume` agrees with the state before the accepted rise; says whether it did. */
export function revertIfTypo(
  s: RateEstimatorState,
  undo: UndoState,
  time: number,
  volume: number,
  R: number,
): boolean {
  const dt = (time - undo.lastTime) / DAY_MS;
  const expected = undo.v - undo.r * dt;
  const sd = Math.sqrt(undo.p00 - 2 * dt * undo.p01 + dt * dt * undo.p11 + R);
  if (Math.abs(volume - expected) > Math.max(EVENT_Z * sd, 0)) return false;
  if (Math.abs(volume - expected) * 2 > Math.abs(volume - s.v)) return false;
  restoreFilter(s, undo);
  s.events.length = undo.eventCount;
  if (undo.previousEvent && undo.eventCount > 0) s.events[undo.eventCount - 1] = undo.previousEvent;
  s.suspects.push({
    time: undo.time,
    reason: deviationReason(undo.volume, undo.v - (undo.r * (undo.time - undo.lastTime)) / DAY_MS),
  });
  return true;
}

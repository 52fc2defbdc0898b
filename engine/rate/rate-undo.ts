// Sparse readings taken as a rate change keep the filter as it was for one more reading. Two deviant readings
// fit a rate change and a level shift equally well (a withdrawal a reading fell inside, or one followed by a
// spike); if the next reading goes on at the old rate from one of them, it was a shift and the filter goes back.
import { deviationReason } from './suspect.js';
import * as tuning from './tuning.js';
import type { RateChangeUndo, RateEstimatorState, TimedVolume } from './types.js';
import { filterSnapshot, restoreFilter } from './undo.js';

const { DAY_MS, EVENT_Z } = tuning;

export function rateUndoSnapshot(s: RateEstimatorState, readings: TimedVolume[]): RateChangeUndo {
  return {
    ...filterSnapshot(s),
    innovationVar: s.innovationVar,
    basisStart: s.basisStart,
    basisCount: s.basisCount,
    changePending: s.changePending ? { ...s.changePending } : null,
    changeCount: s.changes.length,
    readings: readings.map((r) => ({ time: r.time, volume: r.volume })),
  };
}

/**
 * Which absorbed reading a level shift ended at, judged by `volume` at `time` going on from it at the old rate
 * (within EVENT_Z standard deviations, and within half the rate change's own prediction error `error`);
 * -1 when neither does.
 */
export function shiftEndingAt(
  undo: RateChangeUndo,
  time: number,
  volume: number,
  error: number,
  R: number,
): number {
  let best = -1;
  // Clearly closer than the rate change's own prediction, as with a typo (undo.ts).
  let bestMiss = Math.abs(error) / 2;
  undo.readings.forEach((r, k) => {
    const dt = (time - r.time) / DAY_MS;
    const miss = Math.abs(volume - (r.volume - undo.r * dt));
    if (miss <= EVENT_Z * Math.sqrt(2 * R + dt * dt * undo.p11) && miss < bestMiss) {
      best = k;
      bestMiss = miss;
    }
  });
  return best;
}

/** Puts the filter back as it was before the rate change; readings after the shift's end become suspects. */
export function restoreBeforeRateChange(s: RateEstimatorState, undo: RateChangeUndo, end: number): void {
  restoreFilter(s, undo);
  s.innovationVar = undo.innovationVar;
  s.basisStart = undo.basisStart;
  s.basisCount = undo.basisCount;
  s.changePending = undo.changePending;
  s.changes.length = undo.changeCount;
  for (const r of undo.readings.slice(end + 1)) {
    const expected = undo.readings[end]!.volume - (undo.r * (r.time - undo.readings[end]!.time)) / DAY_MS;
    s.suspects.push({ time: r.time, reason: deviationReason(r.volume, expected) });
  }
}

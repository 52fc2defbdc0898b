// Tank events (deliveries, bulk withdrawals, pick-ups) found as level shifts, and logged deliveries.
import type { TankEvent, TankEventType } from './types.js';

/** The event a level shift of sign `shift` means: rises fill, drops empty (a drop on a filling tank is a pick-up). */
export function eventTypeFor(shift: number, filling: boolean): TankEventType {
  if (shift > 0) return 'delivery';
  return filling ? 'pickup' : 'withdrawal';
}

/** The event type a logged delivery stands for: a pick-up on a filling tank. */
export function loggedTypeFor(filling: boolean): TankEventType {
  return filling ? 'pickup' : 'delivery';
}

/** Signed volume change a logged delivery causes. */
export function loggedShift(volume: number, filling: boolean): number {
  return filling ? -volume : volume;
}

/**
 * Adds a detected event, merging it into the previous one when it continues it (a slow fill seen as several
 * steps), so one truck is one event.
 */
export function pushEvent(events: TankEvent[], event: TankEvent, mergeWindowMs: number): void {
  const last = events[events.length - 1];
  if (last && last.type === event.type && event.start - last.end <= mergeWindowMs) {
    last.end = Math.max(last.end, event.end);
    last.volume += event.volume;
    last.logged = last.logged || event.logged;
    return;
  }
  events.push(event);
}

/**
 * Index of an unlogged event of `type` that starts at most `beforeMs` after `time` and ends at most
 * `afterMs` before it, latest first, or -1.
 */
export function findNearbyEvent(
  events: readonly TankEvent[],
  type: TankEventType,
  time: number,
  beforeMs: number,
  afterMs: number,
): number {
  for (let i = events.length - 1; i >= 0; i--) {
    const e = events[i]!;
    if (e.end < time - afterMs) return -1;
    if (e.type === type && !e.logged && e.start <= time + beforeMs) return i;
  }
  return -1;
}

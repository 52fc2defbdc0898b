/**
 * The stored-reading edits several commands make ("no" to a suspect reading, "delete the 7:30 reading",
 * "that was cm", "yes" to a suggested unit), each written with its audit entry so it can be traced.
 */
import type { Request } from '../request.js';
import type { Store } from '../store/index.js';
import type { ReadingKind } from '../store/types.js';

/** Takes a reading out of use; it stays in the store and the audit trail says who did it. */
export function softDeleteReading(
  store: Store,
  request: Request,
  readingId: number,
  action: 'reading.drop' | 'reading.delete',
  now: number,
): void {
  store.readings.softDelete(request.team, readingId, now);
  store.audit.record(
    request.team,
    { userId: request.user, action, target: 'readings', targetId: readingId },
    now,
  );
}

/** Gives a reading a new kind and unit (its number is kept), with the audit entry `detail` describes. */
export function changeReadingUnit(
  store: Store,
  request: Request,
  readingId: number,
  to: { kind: ReadingKind; unit: string },
  detail: Record<string, unknown>,
  now: number,
): void {
  store.readings.correctUnit(request.team, readingId, to.kind, to.unit);
  store.audit.record(
    request.team,
    { userId: request.user, action: 'reading.unit', target: 'readings', targetId: readingId, detail },
    now,
  );
}

import { formatDateTime } from '../replies/format.js';
import type { Reply } from '../replies/reply.js';
import type { Store } from '../store/index.js';
import { defineHandler } from './handler.js';

/** Soft-deletes the sender's own last reading or delivery and records the undo in the audit trail. */
export const undoHandler = defineHandler({
  type: 'undo',
  run: (_command, { store, request, now, timeZone }) => {
    const entry = store.audit.lastUndoable(request.team, request.user);
    if (!entry || entry.targetId === null) {
      return [
        {
          kind: 'error',
          visibility: 'sender',
          headline: 'Nothing of yours to undo: you have logged no reading or delivery that is still in use.',
        },
      ];
    }
    const removed = removeRow(store, request.team, entry.target, entry.targetId, now);
    store.audit.markUndone(request.team, entry.id, now);
    store.pending.clear(request.team, request.channel, request.user);
    store.audit.record(
      request.team,
      {
        userId: request.user,
        action: 'undo',
        detail: { auditId: entry.id, undid: entry.action, target: entry.target, targetId: entry.targetId },
      },
      now,
    );
    if (!removed) {
      return [{ kind: 'confirmation', visibility: 'sender', headline: 'That entry was already removed.' }];
    }
    const reply: Reply = {
      kind: 'confirmation',
      visibility: 'channel',
      headline: `Undone: ${removed.what} "${removed.rawText}" (${formatDateTime(removed.time, timeZone)}) is no longer used.`,
      facts: [{ label: 'Kept', value: 'in the audit trail; figures are recomputed without it' }],
    };
    return [reply];
  },
});

function removeRow(
  store: Store,
  teamId: string,
  target: string | null,
  id: number,
  now: number,
): { what: string; rawText: string; time: number } | undefined {
  if (target === 'readings') {
    const row = store.readings.byId(teamId, id);
    if (!row || !store.readings.softDelete(teamId, id, now)) return undefined;
    return { what: 'the reading', rawText: row.rawText, time: row.time };
  }
  if (target === 'deliveries') {
    const row = store.deliveries.byId(teamId, id);
    if (!row || !store.deliveries.softDelete(teamId, id, now)) return undefined;
    return { what: 'the delivery', rawText: row.rawText, time: row.time };
  }
  return undefined;
}

/**
 * Every live tank's status for a team's digest, read in one SQLite transaction per team. The store runs
 * WAL with `synchronous = FULL`, so outside a transaction each rate-cache write of a first look at a tank is
 * its own commit and sync, and each read takes and drops its own snapshot; one transaction makes the team's
 * 50-odd statuses one commit (or one read snapshot), and every tank is seen as of the same instant; the
 * tank rows, the team's zone and its readings, deliveries and rate-cache rows (`teamReads`), read once in it
 * in a few set-based queries, are handed to tankStatus rather than read again per tank.
 * The statuses are those of `tankStatus`, tank by tank, with the history cut to the newest readings the digest
 * reads (`history` and the `deliveries` from its first reading are a suffix of the full ones).
 */
import type { Store } from '../store/open-store.js';
import { teamReads } from '../store/team-reads.js';
import { deliveriesAskedFrom, type TankStatus, tankStatus } from '../tank-status.js';
import { DIGEST_HISTORY_READINGS } from './digest-sections.js';

function statusesOf(store: Store, teamId: string, now: number): TankStatus[] {
  const statuses: TankStatus[] = [];
  const timeZone = store.teams.get(teamId)?.timeZone ?? 'UTC';
  const tanks = store.tanks.list(teamId);
  const ids = tanks.map((t) => t.id);
  // The team's reads in a few set-based queries, not five per tank.
  const reads = teamReads(
    store,
    teamId,
    DIGEST_HISTORY_READINGS,
    (caches, latest) => deliveriesAskedFrom(ids, caches, latest, now),
    ids,
  );
  for (const tank of tanks) {
    const options = { historyLimit: DIGEST_HISTORY_READINGS, known: { tank, timeZone, reads } };
    const status = tankStatus(store, teamId, tank.id, now, options);
    if (status) statuses.push(status);
  }
  return statuses;
}

const isBusy = (e: unknown) =>
  e instanceof Error && 'code' in e && typeof e.code === 'string' && e.code.startsWith('SQLITE_BUSY');

export function digestStatuses(store: Store, teamId: string, now: number): TankStatus[] {
  // IMMEDIATE: a first look at a tank writes its rate state, and a read transaction that turns into a write
  // fails at once (SQLITE_BUSY, no wait) if another process wrote since it began; taking the write lock
  // first waits the store's busy timeout instead, as each separate write did before.
  try {
    return store.db.transaction(() => statusesOf(store, teamId, now)).immediate();
  } catch (e) {
    // Another process held the write lock past the timeout: read without the transaction, as before it
    // (statuses whose rate state is kept need no write; a first look still needs the lock and may throw).
    if (!isBusy(e)) throw e;
    return statusesOf(store, teamId, now);
  }
}

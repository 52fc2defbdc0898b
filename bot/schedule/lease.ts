import type Database from 'better-sqlite3';

/**
 * A lease row so that two scheduler processes started by mistake on one store do not both post: the holder
 * renews it on every tick; another process takes over only once it has expired (the holder died or hung).
 * Time comes from the caller's clock, never from inside.
 */
export interface Lease {
  readonly holder: string;
  /** Takes or renews the lease at `now`; false when another live holder has it. */
  acquire(now: number): boolean;
  /** True when this holder's lease is unexpired at `now` (checked inside the claim transaction). */
  holds(now: number): boolean;
  /** Gives the lease up at once (clean shutdown), so a successor need not wait for it to expire. */
  release(): void;
}

interface LeaseRow {
  holder: string;
  expires_at: number;
}

export function createLease(db: Database.Database, name: string, holder: string, ttlMs: number): Lease {
  const read = db.prepare<[string], LeaseRow>('SELECT holder, expires_at FROM schedule_lease WHERE name = ?');
  const write = db.prepare(
    `INSERT INTO schedule_lease (name, holder, expires_at) VALUES (?, ?, ?)
     ON CONFLICT (name) DO UPDATE SET holder = excluded.holder, expires_at = excluded.expires_at`,
  );
  const drop = db.prepare('DELETE FROM schedule_lease WHERE name = ? AND holder = ?');
  const acquire = db.transaction((now: number): boolean => {
    const row = read.get(name);
    if (row && row.holder !== holder && row.expires_at > now) return false;
    // Renewing only past half the term saves a synced write on most ticks; the lease still never lapses
    // while the holder ticks more often than every ttl/2.
    if (row?.holder !== holder || row.expires_at - now < ttlMs / 2) write.run(name, holder, now + ttlMs);
    return true;
  });
  return {
    holder,
    // IMMEDIATE takes the write lock before reading, so two processes cannot both see an expired lease.
    acquire: (now) => {
      // Cheap read first: the common case (another live holder, or ours with time left) needs no write lock.
      const row = read.get(name);
      if (row && row.expires_at > now && (row.holder !== holder || row.expires_at - now >= ttlMs / 2)) {
        return row.holder === holder;
      }
      return acquire.immediate(now);
    },
    holds: (now) => {
      const row = read.get(name);
      return row !== undefined && row.holder === holder && row.expires_at > now;
    },
    release: () => {
      drop.run(name, holder);
    },
  };
}

/** Thrown inside a claim when another process took the lease; ends the tick without posting. */
export class LeaseLostError extends Error {
  constructor(holder: string) {
    super(`scheduler ${holder} no longer holds the lease`);
  }
}

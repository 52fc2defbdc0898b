import type Database from 'better-sqlite3';

/**
 * The scheduler's tables (appended to the store's migrations list):
 * - schedule_lease: one row per named job; the process holding an unexpired lease is the only one that posts.
 * - schedule_posts: every digest and notice, claimed (inserted) before it is delivered. The key of a digest
 *   is (team, channel, 'digest', local date), so a day's digest can be claimed once, by one process. The
 *   replies are stored with the claim so a retry after a crash posts the same message.
 * - notice_states: the notice state machine per tank and rule (see notice-machine.ts).
 */
export function createScheduleTables(db: Database.Database): void {
  db.exec(`
    CREATE TABLE schedule_lease (
      name TEXT PRIMARY KEY,
      holder TEXT NOT NULL,
      expires_at INTEGER NOT NULL
    ) STRICT;

    CREATE TABLE schedule_posts (
      team_id TEXT NOT NULL REFERENCES teams(id),
      channel TEXT NOT NULL,
      kind TEXT NOT NULL CHECK (kind IN ('digest', 'notice', 'stale')),
      key TEXT NOT NULL,
      due_at INTEGER NOT NULL,
      status TEXT NOT NULL CHECK (status IN ('pending', 'delivered', 'skipped', 'expired')),
      payload TEXT,
      claimed_by TEXT,
      claimed_at INTEGER,
      attempts INTEGER NOT NULL DEFAULT 0,
      delivered_at INTEGER,
      note TEXT,
      PRIMARY KEY (team_id, channel, kind, key)
    ) STRICT;
    CREATE INDEX schedule_posts_pending ON schedule_posts (due_at) WHERE status = 'pending';

    CREATE TABLE notice_states (
      team_id TEXT NOT NULL,
      tank_id INTEGER NOT NULL,
      rule TEXT NOT NULL,
      state TEXT NOT NULL CHECK (state IN ('armed', 'fired')),
      changed_at INTEGER NOT NULL,
      seen_reading_at INTEGER,
      PRIMARY KEY (team_id, tank_id, rule),
      FOREIGN KEY (team_id, tank_id) REFERENCES tanks (team_id, id)
    ) STRICT;
  `);
}

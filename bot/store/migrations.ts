import type Database from 'better-sqlite3';
import { createScheduleTables } from '../schedule/schema.js';
import { RATE_AS_OF_SQL, RATE_CACHE_SQL, RATE_LEAN_SQL, RATE_SUMMARY_SQL } from './rate-cache.js';

/**
 * The store's schema, as an ordered list: each migration runs once, in order, inside one transaction, and
 * `PRAGMA user_version` records how far a file has come. Append only; never edit a migration that shipped.
 * Every table carries `team_id`, and child rows reference their tank by (team_id, tank_id), so a row can
 * never point at another team's tank.
 */
export interface Migration {
  version: number;
  name: string;
  up(db: Database.Database): void;
}

export const migrations: Migration[] = [
  {
    version: 1,
    name: 'teams, members, tanks, readings, deliveries, audit, processed requests, pending exchanges',
    up(db) {
      db.exec(`
        CREATE TABLE teams (
          id TEXT PRIMARY KEY,
          name TEXT,
          time_zone TEXT NOT NULL DEFAULT 'UTC',
          digest_time TEXT,
          digest_days TEXT,
          digest_channel TEXT,
          demo INTEGER NOT NULL DEFAULT 0,
          created_at INTEGER NOT NULL
        ) STRICT;

        CREATE TABLE members (
          team_id TEXT NOT NULL REFERENCES teams(id),
          user_id TEXT NOT NULL,
          name TEXT,
          role TEXT NOT NULL CHECK (role IN ('admin', 'member')),
          created_at INTEGER NOT NULL,
          PRIMARY KEY (team_id, user_id)
        ) STRICT;

        CREATE TABLE tanks (
          id INTEGER PRIMARY KEY,
          team_id TEXT NOT NULL REFERENCES teams(id),
          code TEXT NOT NULL,
          name TEXT NOT NULL,
          site TEXT,
          product TEXT,
          spec TEXT NOT NULL,
          settings TEXT NOT NULL DEFAULT '{}',
          created_by TEXT NOT NULL,
          created_at INTEGER NOT NULL,
          updated_at INTEGER NOT NULL,
          deleted_at INTEGER,
          UNIQUE (team_id, id)
        ) STRICT;
        CREATE UNIQUE INDEX tanks_live_code ON tanks (team_id, code COLLATE NOCASE) WHERE deleted_at IS NULL;

        CREATE TABLE readings (
          id INTEGER PRIMARY KEY,
          team_id TEXT NOT NULL,
          tank_id INTEGER NOT NULL,
          time INTEGER NOT NULL,
          kind TEXT NOT NULL CHECK (kind IN ('level', 'ullage', 'percent', 'volume')),
          value REAL NOT NULL,
          unit TEXT NOT NULL,
          raw_text TEXT NOT NULL,
          user_id TEXT NOT NULL,
          status TEXT NOT NULL DEFAULT 'ok' CHECK (status IN ('ok', 'held')),
          created_at INTEGER NOT NULL,
          deleted_at INTEGER,
          FOREIGN KEY (team_id, tank_id) REFERENCES tanks (team_id, id)
        ) STRICT;
        CREATE INDEX readings_by_tank_time ON readings (team_id, tank_id, time);

        CREATE TABLE deliveries (
          id INTEGER PRIMARY KEY,
          team_id TEXT NOT NULL,
          tank_id INTEGER NOT NULL,
          time INTEGER NOT NULL,
          volume REAL NOT NULL,
          unit TEXT NOT NULL,
          ticket TEXT,
          raw_text TEXT NOT NULL,
          user_id TEXT NOT NULL,
          created_at INTEGER NOT NULL,
          deleted_at INTEGER,
          FOREIGN KEY (team_id, tank_id) REFERENCES tanks (team_id, id)
        ) STRICT;
        CREATE INDEX deliveries_by_tank_time ON deliveries (team_id, tank_id, time);

        CREATE TABLE audit (
          id INTEGER PRIMARY KEY,
          team_id TEXT NOT NULL REFERENCES teams(id),
          user_id TEXT NOT NULL,
          at INTEGER NOT NULL,
          action TEXT NOT NULL,
          target TEXT,
          target_id INTEGER,
          detail TEXT NOT NULL DEFAULT '{}',
          undone_at INTEGER
        ) STRICT;
        CREATE INDEX audit_by_user ON audit (team_id, user_id, id);

        CREATE TABLE processed_requests (
          team_id TEXT NOT NULL,
          dedupe_key TEXT NOT NULL,
          replies TEXT NOT NULL,
          at INTEGER NOT NULL,
          PRIMARY KEY (team_id, dedupe_key)
        ) STRICT;

        CREATE TABLE pending_exchanges (
          team_id TEXT NOT NULL REFERENCES teams(id),
          channel TEXT NOT NULL,
          user_id TEXT NOT NULL,
          kind TEXT NOT NULL,
          state TEXT NOT NULL,
          created_at INTEGER NOT NULL,
          PRIMARY KEY (team_id, channel, user_id)
        ) STRICT;
      `);
    },
  },
  { version: 2, name: 'schedule: lease, claimed posts, notice states', up: createScheduleTables },
  {
    version: 3,
    name: 'rate cache per tank (dropped by triggers on any change back in time); covering index of readings',
    up(db) {
      db.exec(RATE_CACHE_SQL);
    },
  },
  {
    version: 4,
    name: 'rate cache summary per tank (events, newest readings) so a digest does not parse the state',
    up(db) {
      db.exec(RATE_SUMMARY_SQL);
    },
  },
  {
    version: 5,
    name: 'rate cache points and summary in lean forms (faster to parse for a digest); rebuilt once',
    up(db) {
      db.exec(RATE_LEAN_SQL);
    },
  },
  {
    version: 6,
    name: 'rate cache instants indexed (a digest walks to the newer readings without reading each state)',
    up(db) {
      db.exec(RATE_AS_OF_SQL);
    },
  },
];

/** Brings a database up to the last migration; each step commits on its own so a crash leaves a known version. */
export function migrate(db: Database.Database, list: Migration[] = migrations): number {
  const current = db.pragma('user_version', { simple: true }) as number;
  const sorted = [...list].sort((a, b) => a.version - b.version);
  for (const migration of sorted) {
    if (migration.version <= current) continue;
    db.transaction(() => {
      migration.up(db);
      db.pragma(`user_version = ${Math.trunc(migration.version)}`);
    })();
  }
  return db.pragma('user_version', { simple: true }) as number;
}

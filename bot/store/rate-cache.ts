import type Database from 'better-sqlite3';
import type { RateEstimatorState, RatePoint } from '../../engine/rate/index.js';
import { parseJsonColumn } from './json-column.js';

/**
 * The rate estimator's state per tank after every reading up to `asOfTime`, so a question adds only the
 * readings since. Triggers (migration 3) delete a tank's row whenever anything at or before `asOfTime`
 * changes (an insert back in time, a soft delete, a unit fix, a held reading confirmed) or the tank's shape
 * or settings change; `specKey` guards the rest. It is a cache: dropping it only costs time.
 */
export interface RateCacheEntry {
  asOfTime: number;
  /** Readings converted and fed, and readings the shape could not hold. */
  readings: number;
  skipped: number;
  specKey: string;
  state: RateEstimatorState;
  /** The point of the newest reading, and the newest one the estimator trusted. */
  points: { latest: RatePoint | null; trusted: RatePoint | null };
}

export interface RateCacheRepo {
  get(teamId: string, tankId: number): RateCacheEntry | undefined;
  put(teamId: string, tankId: number, entry: RateCacheEntry): void;
  drop(teamId: string, tankId: number): void;
}

export interface RateCacheDbRow {
  as_of_time: number;
  readings: number;
  skipped: number;
  spec_key: string;
  state: string;
  points: string;
}

export const RATE_CACHE_SQL = `
  CREATE INDEX readings_series ON readings (team_id, tank_id, time, id, kind, value, unit)
    WHERE deleted_at IS NULL AND status = 'ok';
  CREATE TABLE rate_cache (
    team_id TEXT NOT NULL,
    tank_id INTEGER NOT NULL,
    as_of_time INTEGER NOT NULL,
    readings INTEGER NOT NULL,
    skipped INTEGER NOT NULL,
    spec_key TEXT NOT NULL,
    state TEXT NOT NULL,
    points TEXT NOT NULL,
    PRIMARY KEY (team_id, tank_id),
    FOREIGN KEY (team_id, tank_id) REFERENCES tanks (team_id, id)
  ) STRICT;
  CREATE TRIGGER rate_cache_reading_back_in_time AFTER INSERT ON readings
    WHEN NEW.time <= (SELECT as_of_time FROM rate_cache WHERE team_id = NEW.team_id AND tank_id = NEW.tank_id)
    BEGIN DELETE FROM rate_cache WHERE team_id = NEW.team_id AND tank_id = NEW.tank_id; END;
  CREATE TRIGGER rate_cache_reading_changed AFTER UPDATE ON readings
    BEGIN DELETE FROM rate_cache WHERE team_id = OLD.team_id AND tank_id = OLD.tank_id; END;
  CREATE TRIGGER rate_cache_reading_deleted AFTER DELETE ON readings
    BEGIN DELETE FROM rate_cache WHERE team_id = OLD.team_id AND tank_id = OLD.tank_id; END;
  CREATE TRIGGER rate_cache_delivery_back_in_time AFTER INSERT ON deliveries
    WHEN NEW.time <= (SELECT as_of_time FROM rate_cache WHERE team_id = NEW.team_id AND tank_id = NEW.tank_id)
    BEGIN DELETE FROM rate_cache WHERE team_id = NEW.team_id AND tank_id = NEW.tank_id; END;
  CREATE TRIGGER rate_cache_delivery_changed AFTER UPDATE ON deliveries
    BEGIN DELETE FROM rate_cache WHERE team_id = OLD.team_id AND tank_id = OLD.tank_id; END;
  CREATE TRIGGER rate_cache_delivery_deleted AFTER DELETE ON deliveries
    BEGIN DELETE FROM rate_cache WHERE team_id = OLD.team_id AND tank_id = OLD.tank_id; END;
  CREATE TRIGGER rate_cache_tank_changed AFTER UPDATE OF spec, settings, deleted_at ON tanks
    BEGIN DELETE FROM rate_cache WHERE team_id = OLD.team_id AND tank_id = OLD.id; END;
`;

/** A stored row as an entry; a state that does not parse is no entry (the cache is rebuilt). */
export function rateCacheEntryOf(row: RateCacheDbRow): RateCacheEntry | undefined {
  const state = parseJsonColumn<RateEstimatorState | null>(row.state, null);
  if (!state) return undefined;
  return {
    asOfTime: row.as_of_time,
    readings: row.readings,
    skipped: row.skipped,
    specKey: row.spec_key,
    state,
    points: parseJsonColumn<RateCacheEntry['points']>(row.points, { latest: null, trusted: null }),
  };
}

export function rateCacheRepo(db: Database.Database): RateCacheRepo {
  const get = db.prepare<[string, number], RateCacheDbRow>(
    'SELECT as_of_time, readings, skipped, spec_key, state, points FROM rate_cache WHERE team_id = ? AND tank_id = ?',
  );
  const put = db.prepare(
    `INSERT INTO rate_cache (team_id, tank_id, as_of_time, readings, skipped, spec_key, state, points)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?)
     ON CONFLICT (team_id, tank_id) DO UPDATE SET as_of_time = excluded.as_of_time, readings = excluded.readings,
       skipped = excluded.skipped, spec_key = excluded.spec_key, state = excluded.state,
       points = excluded.points`,
  );
  const drop = db.prepare('DELETE FROM rate_cache WHERE team_id = ? AND tank_id = ?');
  return {
    get: (teamId, tankId) => {
      const row = get.get(teamId, tankId);
      return row ? rateCacheEntryOf(row) : undefined;
    },
    put: (teamId, tankId, e) => {
      put.run(
        teamId,
        tankId,
        e.asOfTime,
        e.readings,
        e.skipped,
        e.specKey,
        JSON.stringify(e.state),
        JSON.stringify(e.points),
      );
    },
    drop: (teamId, tankId) => {
      drop.run(teamId, tankId);
    },
  };
}

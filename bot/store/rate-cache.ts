import type Database from 'better-sqlite3';
import {
  isRateEstimatorState,
  type RateEstimatorState,
  type RatePoint,
  type TankEvent,
} from '../../engine/rate/index.js';
import { parseJsonColumn } from './json-column.js';
import { type ReadingDbRow, type SeriesReading, toReading } from './readings.js';
import type { Reading } from './types.js';

/**
 * The rate estimator's state per tank after every reading up to `asOfTime`, so a question adds only the
 * readings since. Triggers (migration 3) delete a tank's row whenever anything at or before `asOfTime`
 * changes (an insert back in time, a soft delete, a unit fix, a held reading confirmed) or the tank's shape
 * or settings change; `specKey` guards the rest. It is a cache: dropping it only costs time.
 */
export interface RateCacheWrite {
  asOfTime: number;
  /** Readings converted and fed, and readings the shape could not hold. */
  readings: number;
  skipped: number;
  specKey: string;
  state: RateEstimatorState;
  /** The point of the newest reading, and the newest one the estimator trusted. */
  points: { latest: RatePoint | null; trusted: RatePoint | null };
}

/**
 * A row as read: everything but the estimator's state, which is parsed (`rateCache.state`) only to resume
 * with newer readings. The summary answers a status when nothing came after `asOfTime`.
 */
export type RateCacheEntry = Omit<RateCacheWrite, 'state'> & { summary: RateSummary };

/**
 * Kept beside the state at write time (migration 4), so a digest reads one small row per tank: the state's
 * version and events, and the newest live confirmed readings at or before `asOfTime`, which the triggers
 * keep true (any change among them drops the row). The repository reads those readings itself on `put`.
 */
export interface RateSummary {
  /** RATE_STATE_VERSION of the state: events and points of another engine version are not used. */
  version: number;
  events: TankEvent[];
  /** The newest `RECENT_KEPT` of them (all of them if fewer), newest first. */
  recent: SeriesReading[];
  /** The newest of them whole (its raw text is shown), null when there is none. */
  latest: Reading | null;
}

/** Readings a summary keeps: at least the 11 a digest reads, with room for a few the shape cannot hold. */
export const RECENT_KEPT = 16;

export interface RateCacheRepo {
  get(teamId: string, tankId: number): RateCacheEntry | undefined;
  /** The stored estimator state, if it parses as one of this engine version (otherwise rebuild). */
  state(teamId: string, tankId: number): RateEstimatorState | undefined;
  put(teamId: string, tankId: number, entry: RateCacheWrite): void;
  drop(teamId: string, tankId: number): void;
}

export interface RateCacheDbRow {
  as_of_time: number;
  readings: number;
  skipped: number;
  spec_key: string;
  points: string;
  summary: string | null;
}

/** The columns a `RateCacheDbRow` is read from. */
export const RATE_CACHE_COLUMNS = 'as_of_time, readings, skipped, spec_key, points, summary';

/**
 * Migration 4: the summary column. Rows written before it have none and are dropped, so each tank's state is
 * rebuilt once with one.
 */
export const RATE_SUMMARY_SQL = `
  DELETE FROM rate_cache;
  ALTER TABLE rate_cache ADD COLUMN summary TEXT;
`;

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

type SeriesTuple = [number, number, SeriesReading['kind'], number, string];

const isSeriesTuple = (t: unknown): t is SeriesTuple =>
  Array.isArray(t) &&
  t.length === 5 &&
  typeof t[0] === 'number' &&
  typeof t[1] === 'number' &&
  typeof t[2] === 'string' &&
  typeof t[3] === 'number' &&
  typeof t[4] === 'string';

const isDbReading = (r: unknown): r is ReadingDbRow =>
  typeof r === 'object' &&
  r !== null &&
  typeof (r as ReadingDbRow).id === 'number' &&
  typeof (r as ReadingDbRow).time === 'number' &&
  typeof (r as ReadingDbRow).raw_text === 'string';

/** A stored summary, or undefined when it is missing or damaged (the row is then no entry: rebuilt). */
function summaryOf(text: string | null): RateSummary | undefined {
  const s = parseJsonColumn<Record<string, unknown> | null>(text, null);
  if (typeof s !== 'object' || s === null) return undefined;
  const { version, events, recent, latest } = s;
  if (typeof version !== 'number' || !Array.isArray(events) || !Array.isArray(recent)) return undefined;
  if (!recent.every(isSeriesTuple) || !(latest === null || isDbReading(latest))) return undefined;
  return {
    version,
    events: events as TankEvent[],
    recent: recent.map(([id, time, kind, value, unit]) => ({ id, time, kind, value, unit })),
    latest: latest === null ? null : toReading(latest),
  };
}

/** A stored row as an entry; a summary that does not parse is no entry (the cache is rebuilt). */
export function rateCacheEntryOf(row: RateCacheDbRow): RateCacheEntry | undefined {
  const summary = summaryOf(row.summary);
  if (!summary) return undefined;
  return {
    asOfTime: row.as_of_time,
    readings: row.readings,
    skipped: row.skipped,
    specKey: row.spec_key,
    points: parseJsonColumn<RateCacheEntry['points']>(row.points, { latest: null, trusted: null }),
    summary,
  };
}

export function rateCacheRepo(db: Database.Database): RateCacheRepo {
  const get = db.prepare<[string, number], RateCacheDbRow>(
    `SELECT ${RATE_CACHE_COLUMNS} FROM rate_cache WHERE team_id = ? AND tank_id = ?`,
  );
  const state = db
    .prepare<[string, number], string>('SELECT state FROM rate_cache WHERE team_id = ? AND tank_id = ?')
    .pluck(true);
  // The summary's readings, newest first (the WHERE is the partial index readings_series's).
  const recent = db.prepare<[string, number, number, number], ReadingDbRow>(
    `SELECT id, team_id, tank_id, time, kind, value, unit, raw_text, user_id, status, created_at
     FROM readings INDEXED BY readings_series
     WHERE team_id = ? AND tank_id = ? AND deleted_at IS NULL AND status = 'ok' AND time <= ?
     ORDER BY time DESC, id DESC LIMIT ?`,
  );
  const put = db.prepare(
    `INSERT INTO rate_cache (team_id, tank_id, as_of_time, readings, skipped, spec_key, state, points, summary)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)
     ON CONFLICT (team_id, tank_id) DO UPDATE SET as_of_time = excluded.as_of_time, readings = excluded.readings,
       skipped = excluded.skipped, spec_key = excluded.spec_key, state = excluded.state,
       points = excluded.points, summary = excluded.summary`,
  );
  const drop = db.prepare('DELETE FROM rate_cache WHERE team_id = ? AND tank_id = ?');
  return {
    get: (teamId, tankId) => {
      const row = get.get(teamId, tankId);
      return row ? rateCacheEntryOf(row) : undefined;
    },
    state: (teamId, tankId) => {
      const parsed = parseJsonColumn<unknown>(state.get(teamId, tankId), null);
      return isRateEstimatorState(parsed) ? parsed : undefined;
    },
    put: (teamId, tankId, e) => {
      const rows = recent.all(teamId, tankId, e.asOfTime, RECENT_KEPT);
      const summary = {
        version: e.state.version,
        events: e.state.events,
        recent: rows.map((r) => [r.id, r.time, r.kind, r.value, r.unit]),
        latest: rows[0] ?? null,
      };
      put.run(
        teamId,
        tankId,
        e.asOfTime,
        e.readings,
        e.skipped,
        e.specKey,
        JSON.stringify(e.state),
        JSON.stringify(e.points),
        JSON.stringify(summary),
      );
    },
    drop: (teamId, tankId) => {
      drop.run(teamId, tankId);
    },
  };
}

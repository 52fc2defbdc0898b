import type Database from 'better-sqlite3';
import {
  eventsOf,
  isRateEstimatorState,
  type RateEstimatorState,
  type RatePoint,
  type TankEvent,
} from '../../engine/rate/index.js';
import { parseJsonColumn } from './json-column.js';
import type { ReadingDbRow, SeriesReading } from './readings.js';
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

/**
 * Migration 5: `points` and `summary` in their lean forms (below). Rows in the earlier forms are dropped, so
 * each tank's state is rebuilt once in these.
 */
export const RATE_LEAN_SQL = 'DELETE FROM rate_cache;';

/**
 * Migration 6: each cache row's instant in an index of its own, so the walk to the readings after it (a
 * team's digest) reads the index, not the rows: a row holds the whole estimator state (about 2.5 KB, a page
 * each), and that walk read every one of them.
 */
export const RATE_AS_OF_SQL = 'CREATE INDEX rate_cache_as_of ON rate_cache (team_id, tank_id, as_of_time);';

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

/*
 * The stored forms, lean because a digest parses every tank's row each morning (parsing was a large part of
 * it): `points` is `[latest, trusted]`, or `[latest]` when the two are the same point; `summary` is
 * `[version, events, recent, latest]` with the recent readings flat, five values each (id, time, kind, value,
 * unit), newest first, and of the newest one whole only what those five and the row do not say (raw text,
 * user, status, created at), or null when there is none.
 */
type LatestRest = [rawText: string, userId: string, status: Reading['status'], createdAt: number];

function isRecentFlat(flat: unknown): flat is (string | number)[] {
  if (!Array.isArray(flat) || flat.length % 5 !== 0) return false;
  for (let i = 0; i < flat.length; i += 5) {
    if (
      typeof flat[i] !== 'number' ||
      typeof flat[i + 1] !== 'number' ||
      typeof flat[i + 2] !== 'string' ||
      typeof flat[i + 3] !== 'number' ||
      typeof flat[i + 4] !== 'string'
    ) {
      return false;
    }
  }
  return true;
}

const isLatestRest = (r: unknown): r is LatestRest =>
  Array.isArray(r) &&
  r.length === 4 &&
  typeof r[0] === 'string' &&
  typeof r[1] === 'string' &&
  typeof r[2] === 'string' &&
  typeof r[3] === 'number';

/** A stored summary, or undefined when it is missing or damaged (the row is then no entry: rebuilt). */
function summaryOf(text: string | null, teamId: string, tankId: number): RateSummary | undefined {
  const s = parseJsonColumn<unknown>(text, null);
  if (!Array.isArray(s) || s.length !== 4) return undefined;
  const [version, events, flat, stored] = s as unknown[];
  if (typeof version !== 'number' || !Array.isArray(events) || !isRecentFlat(flat)) return undefined;
  // The newest reading's rest is there exactly when there are readings.
  const rest = stored === null ? null : isLatestRest(stored) ? stored : undefined;
  if (rest === undefined || (rest === null) !== (flat.length === 0)) return undefined;
  const recent: SeriesReading[] = [];
  for (let i = 0; i < flat.length; i += 5) {
    recent.push({
      id: flat[i] as number,
      time: flat[i + 1] as number,
      kind: flat[i + 2] as SeriesReading['kind'],
      value: flat[i + 3] as number,
      unit: flat[i + 4] as string,
    });
  }
  const newest = recent[0];
  const latest: Reading | null =
    newest && rest
      ? {
          id: newest.id,
          teamId,
          tankId,
          time: newest.time,
          kind: newest.kind,
          value: newest.value,
          unit: newest.unit,
          rawText: rest[0],
          userId: rest[1],
          status: rest[2],
          createdAt: rest[3],
        }
      : null;
  return { version, events: events as TankEvent[], recent, latest };
}

function summaryText(version: number, events: readonly TankEvent[], rows: readonly ReadingDbRow[]): string {
  const flat: (string | number)[] = [];
  for (const r of rows) flat.push(r.id, r.time, r.kind, r.value, r.unit);
  const newest = rows[0];
  const rest: LatestRest | null = newest
    ? [newest.raw_text, newest.user_id, newest.status, newest.created_at]
    : null;
  return JSON.stringify([version, events, flat, rest]);
}

function pointsOf(text: string): RateCacheEntry['points'] | undefined {
  const p = parseJsonColumn<unknown>(text, null);
  if (!Array.isArray(p) || (p.length !== 1 && p.length !== 2)) return undefined;
  const [latest, trusted = latest] = p as (RatePoint | null)[];
  return { latest: latest ?? null, trusted: trusted ?? null };
}

function pointsText({ latest, trusted }: RateCacheWrite['points']): string {
  const one = JSON.stringify(latest);
  const other = JSON.stringify(trusted);
  return one === other ? `[${one}]` : `[${one},${other}]`;
}

/** A stored row of a team's tank as an entry; a summary that does not parse is no entry (rebuilt). */
export function rateCacheEntryOf(
  row: RateCacheDbRow,
  teamId: string,
  tankId: number,
): RateCacheEntry | undefined {
  const summary = summaryOf(row.summary, teamId, tankId);
  const points = summary && pointsOf(row.points);
  if (!summary || !points) return undefined;
  return {
    asOfTime: row.as_of_time,
    readings: row.readings,
    skipped: row.skipped,
    specKey: row.spec_key,
    points,
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
      return row ? rateCacheEntryOf(row, teamId, tankId) : undefined;
    },
    state: (teamId, tankId) => {
      const parsed = parseJsonColumn<unknown>(state.get(teamId, tankId), null);
      return isRateEstimatorState(parsed) ? parsed : undefined;
    },
    put: (teamId, tankId, e) => {
      const rows = recent.all(teamId, tankId, e.asOfTime, RECENT_KEPT);
      put.run(
        teamId,
        tankId,
        e.asOfTime,
        e.readings,
        e.skipped,
        e.specKey,
        JSON.stringify(e.state),
        pointsText(e.points),
        summaryText(e.state.version, eventsOf(e.state), rows),
      );
    },
    drop: (teamId, tankId) => {
      drop.run(teamId, tankId);
    },
  };
}

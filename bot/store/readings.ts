import type Database from 'better-sqlite3';
import type { NewReading, Reading, ReadingKind, ReadingStatus } from './types.js';

export interface ReadingDbRow {
  id: number;
  team_id: string;
  tank_id: number;
  time: number;
  kind: ReadingKind;
  value: number;
  unit: string;
  raw_text: string;
  user_id: string;
  status: ReadingStatus;
  created_at: number;
}

export interface ReadingsRepo {
  add(teamId: string, reading: NewReading, at: number): Reading;
  byId(teamId: string, id: number): Reading | undefined;
  /** Live readings of one tank in time order (by id within the same instant); held ones only when asked. */
  forTank(teamId: string, tankId: number, options?: { since?: number; includeHeld?: boolean }): Reading[];
  /**
   * Live confirmed readings after `since` with only what a volume needs, from a covering index: the fast
   * path of every figure (a question reads thousands of them).
   */
  series(teamId: string, tankId: number, since: number): SeriesReading[];
  /** The newest `limit` of those after `since`, in time order (a chart's history of a dense sensor). */
  recentSeries(teamId: string, tankId: number, since: number, limit: number): SeriesReading[];
  /** The latest live, confirmed reading at or before `at`, if any. */
  latest(teamId: string, tankId: number, at?: number): Reading | undefined;
  setStatus(teamId: string, id: number, status: ReadingStatus): boolean;
  /** A unit correction ("that was cm"): the number stands, its kind and unit change; the raw text stays. */
  correctUnit(teamId: string, id: number, kind: ReadingKind, unit: string): boolean;
  /** The newest live readings of a team (or of one tank), newest first, held ones included. */
  newest(teamId: string, limit: number, tankId?: number): Reading[];
  softDelete(teamId: string, id: number, at: number): boolean;
  restore(teamId: string, id: number): boolean;
}

export const toReading = (r: ReadingDbRow): Reading => ({
  id: r.id,
  teamId: r.team_id,
  tankId: r.tank_id,
  time: r.time,
  kind: r.kind,
  value: r.value,
  unit: r.unit,
  rawText: r.raw_text,
  userId: r.user_id,
  status: r.status,
  createdAt: r.created_at,
});

const LIVE = 'team_id = ? AND tank_id = ? AND deleted_at IS NULL';

/** A reading reduced to what its volume needs. */
export type SeriesReading = Pick<Reading, 'id' | 'time' | 'kind' | 'value' | 'unit'>;

export function readingsRepo(db: Database.Database): ReadingsRepo {
  const insert = db.prepare(
    `INSERT INTO readings (team_id, tank_id, time, kind, value, unit, raw_text, user_id, status, created_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const byId = db.prepare<[string, number], ReadingDbRow>(
    'SELECT * FROM readings WHERE team_id = ? AND id = ? AND deleted_at IS NULL',
  );
  const forTank = db.prepare<[string, number, number, number], ReadingDbRow>(
    `SELECT * FROM readings WHERE ${LIVE} AND time >= ? AND (status = 'ok' OR ? = 1) ORDER BY time, id`,
  );
  // The WHERE matches the partial index readings_series (migration 3) word for word, so SQLite reads the index only.
  const series = db.prepare<[string, number, number], SeriesReading>(
    `SELECT id, time, kind, value, unit FROM readings INDEXED BY readings_series
     WHERE team_id = ? AND tank_id = ? AND deleted_at IS NULL AND status = 'ok' AND time > ? ORDER BY time, id`,
  );
  const recentSeries = db.prepare<[string, number, number, number], SeriesReading>(
    `SELECT id, time, kind, value, unit FROM readings INDEXED BY readings_series
     WHERE team_id = ? AND tank_id = ? AND deleted_at IS NULL AND status = 'ok' AND time > ?
     ORDER BY time DESC, id DESC LIMIT ?`,
  );
  const latest = db.prepare<[string, number, number], ReadingDbRow>(
    `SELECT * FROM readings WHERE ${LIVE} AND status = 'ok' AND time <= ? ORDER BY time DESC, id DESC LIMIT 1`,
  );
  const setStatus = db.prepare(
    'UPDATE readings SET status = ? WHERE team_id = ? AND id = ? AND deleted_at IS NULL',
  );
  const correctUnit = db.prepare(
    'UPDATE readings SET kind = ?, unit = ? WHERE team_id = ? AND id = ? AND deleted_at IS NULL',
  );
  const newestOfTeam = db.prepare<[string, number], ReadingDbRow>(
    'SELECT * FROM readings WHERE team_id = ? AND deleted_at IS NULL ORDER BY time DESC, id DESC LIMIT ?',
  );
  const newestOfTank = db.prepare<[string, number, number], ReadingDbRow>(
    `SELECT * FROM readings WHERE ${LIVE} ORDER BY time DESC, id DESC LIMIT ?`,
  );
  const softDelete = db.prepare(
    'UPDATE readings SET deleted_at = ? WHERE team_id = ? AND id = ? AND deleted_at IS NULL',
  );
  const restore = db.prepare(
    'UPDATE readings SET deleted_at = NULL WHERE team_id = ? AND id = ? AND deleted_at IS NOT NULL',
  );

  return {
    add: (teamId, r, at) => {
      const info = insert.run(
        teamId,
        r.tankId,
        r.time,
        r.kind,
        r.value,
        r.unit,
        r.rawText,
        r.userId,
        r.status ?? 'ok',
        at,
      );
      return toReading(byId.get(teamId, Number(info.lastInsertRowid))!);
    },
    byId: (teamId, id) => {
      const row = byId.get(teamId, id);
      return row ? toReading(row) : undefined;
    },
    forTank: (teamId, tankId, options = {}) =>
      forTank
        .all(teamId, tankId, options.since ?? Number.MIN_SAFE_INTEGER, options.includeHeld ? 1 : 0)
        .map(toReading),
    series: (teamId, tankId, since) => series.all(teamId, tankId, since),
    recentSeries: (teamId, tankId, since, limit) => recentSeries.all(teamId, tankId, since, limit).reverse(),
    latest: (teamId, tankId, at = Number.MAX_SAFE_INTEGER) => {
      const row = latest.get(teamId, tankId, at);
      return row ? toReading(row) : undefined;
    },
    setStatus: (teamId, id, status) => setStatus.run(status, teamId, id).changes === 1,
    correctUnit: (teamId, id, kind, unit) => correctUnit.run(kind, unit, teamId, id).changes === 1,
    newest: (teamId, limit, tankId) =>
      (tankId === undefined ? newestOfTeam.all(teamId, limit) : newestOfTank.all(teamId, tankId, limit)).map(
        toReading,
      ),
    softDelete: (teamId, id, at) => softDelete.run(at, teamId, id).changes === 1,
    restore: (teamId, id) => restore.run(teamId, id).changes === 1,
  };
}

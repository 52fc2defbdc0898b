import type Database from 'better-sqlite3';
import { type DeliveryDbRow, toDelivery } from './deliveries.js';
import type { Store } from './open-store.js';
import { type RateCacheDbRow, type RateCacheEntry, rateCacheEntryOf } from './rate-cache.js';
import { type ReadingDbRow, type SeriesReading, toReading } from './readings.js';
import type { Delivery, Reading } from './types.js';

/**
 * The per-tank reads of a tank's status. `storeReads` asks the store one query at a time; `teamReads` reads a
 * whole team in five set-based queries first and answers from them, so a digest of 50 tanks runs five
 * queries rather than 250. Each answer is the one the store would give in the same transaction: where the
 * prefetch does not cover a question (another `since`, a longer limit), it asks the store.
 */
export interface TankReads {
  rateCache(tankId: number): RateCacheEntry | undefined;
  /** As `readings.series`. */
  series(tankId: number, since: number): SeriesReading[];
  /** As `readings.recentSeries`. */
  recentSeries(tankId: number, since: number, limit: number): SeriesReading[];
  /** As `readings.latest` with no `at`. */
  latest(tankId: number): Reading | undefined;
  /** As `deliveries.forTank` with `since`. */
  deliveries(tankId: number, since: number): Delivery[];
}

export function storeReads(store: Store, teamId: string): TankReads {
  return {
    rateCache: (tankId) => store.rateCache.get(teamId, tankId),
    series: (tankId, since) => store.readings.series(teamId, tankId, since),
    recentSeries: (tankId, since, limit) => store.readings.recentSeries(teamId, tankId, since, limit),
    latest: (tankId) => store.readings.latest(teamId, tankId),
    deliveries: (tankId, since) => store.deliveries.forTank(teamId, tankId, { since }),
  };
}

type SeriesRow = SeriesReading & { tank_id: number };
type SeriesTuple = [number, number, number, SeriesReading['kind'], number, string];

const seriesRowOf = ([tank_id, id, time, kind, value, unit]: SeriesTuple): SeriesRow => ({
  tank_id,
  id,
  time,
  kind,
  value,
  unit,
});

function statementsOf(db: Database.Database) {
  return {
    rateCache: db.prepare<[string], RateCacheDbRow & { tank_id: number }>(
      'SELECT tank_id, as_of_time, readings, skipped, spec_key, state, points FROM rate_cache WHERE team_id = ?',
    ),
    // Readings after each tank's cached state: what the rate estimator still has to be fed (the WHERE is
    // the partial index readings_series's, so the index alone answers it). CROSS JOIN keeps the cache rows
    // outside: SQLite otherwise walked all of the team's readings (five times slower at 30 a tank).
    sinceCache: db.prepare<[string], SeriesRow>(
      `SELECT r.tank_id, r.id, r.time, r.kind, r.value, r.unit
       FROM rate_cache c CROSS JOIN readings r INDEXED BY readings_series
         ON r.team_id = c.team_id AND r.tank_id = c.tank_id AND r.deleted_at IS NULL AND r.status = 'ok'
            AND r.time > c.as_of_time
       WHERE c.team_id = ? ORDER BY r.tank_id, r.time, r.id`,
    ),
    // The newest `limit` live confirmed readings of every tank of the team (a removed one too, as the store
    // answers for it), newest first: a bounded index walk per
    // tank (a window function over all rows would read a dense sensor's whole history, and was slower here).
    // Rows as arrays (`raw`): a third faster than objects at 550 a team; seriesRowOf names them.
    newest: db
      .prepare<[number, string], SeriesTuple>(
        `SELECT r.tank_id, r.id, r.time, r.kind, r.value, r.unit FROM tanks t JOIN readings r ON r.id IN (
         SELECT id FROM readings INDEXED BY readings_series
         WHERE team_id = t.team_id AND tank_id = t.id AND deleted_at IS NULL AND status = 'ok'
         ORDER BY time DESC, id DESC LIMIT ?)
       WHERE t.team_id = ? ORDER BY r.tank_id, r.time DESC, r.id DESC`,
      )
      .raw(true),
    // The newest one whole (its raw text is shown), as `readings.latest`.
    latest: db.prepare<[string], ReadingDbRow>(
      `SELECT r.* FROM tanks t JOIN readings r ON r.id = (
         SELECT id FROM readings INDEXED BY readings_series
         WHERE team_id = t.team_id AND tank_id = t.id AND deleted_at IS NULL AND status = 'ok'
         ORDER BY time DESC, id DESC LIMIT 1)
       WHERE t.team_id = ?`,
    ),
    deliveries: db.prepare<[string, number], DeliveryDbRow>(
      `SELECT * FROM deliveries WHERE team_id = ? AND deleted_at IS NULL AND time >= ?
       ORDER BY tank_id, time, id`,
    ),
  };
}

const statements = new WeakMap<Database.Database, ReturnType<typeof statementsOf>>();

function groupBy<T extends { tank_id: number }>(rows: readonly T[]): Map<number, T[]> {
  const out = new Map<number, T[]>();
  for (const row of rows) {
    const list = out.get(row.tank_id);
    if (list) list.push(row);
    else out.set(row.tank_id, [row]);
  }
  return out;
}

const seriesOfRow = ({ id, time, kind, value, unit }: SeriesReading): SeriesReading => ({
  id,
  time,
  kind,
  value,
  unit,
});

/**
 * A team's reads prefetched: every rate-cache row, the readings after each, the newest `newestLimit` readings
 * of every tank and the deliveries from `deliveriesFrom(caches, latest)` (the earliest instant any tank will
 * ask about). Call it inside the transaction the statuses are read in.
 */
export function teamReads(
  store: Store,
  teamId: string,
  newestLimit: number,
  deliveriesFrom: (
    caches: ReadonlyMap<number, RateCacheEntry>,
    latest: ReadonlyMap<number, Reading>,
  ) => number,
): TankReads {
  let s = statements.get(store.db);
  if (!s) {
    s = statementsOf(store.db);
    statements.set(store.db, s);
  }
  const fallback = storeReads(store, teamId);
  const caches = new Map<number, RateCacheEntry>();
  for (const row of s.rateCache.all(teamId)) {
    const entry = rateCacheEntryOf(row);
    if (entry) caches.set(row.tank_id, entry);
  }
  const sinceCache = groupBy(s.sinceCache.all(teamId));
  const newest = groupBy(s.newest.all(newestLimit, teamId).map(seriesRowOf));
  const latest = new Map<number, Reading>();
  for (const row of s.latest.all(teamId)) latest.set(row.tank_id, toReading(row));
  const from = deliveriesFrom(caches, latest);
  const deliveries = groupBy(s.deliveries.all(teamId, from));

  return {
    rateCache: (tankId) => caches.get(tankId),
    series: (tankId, since) => {
      const cache = caches.get(tankId);
      if (cache?.asOfTime !== since) return fallback.series(tankId, since);
      return (sinceCache.get(tankId) ?? []).map(seriesOfRow);
    },
    recentSeries: (tankId, since, limit) => {
      if (limit > newestLimit) return fallback.recentSeries(tankId, since, limit);
      // Newest first, so those after `since` are a prefix of the newest: the query's answer, reversed.
      const rows = (newest.get(tankId) ?? []).filter((r) => r.time > since).slice(0, limit);
      return rows.reverse().map(seriesOfRow);
    },
    latest: (tankId) => latest.get(tankId),
    deliveries: (tankId, since) => {
      if (since < from) return fallback.deliveries(tankId, since);
      return (deliveries.get(tankId) ?? []).filter((d) => d.time >= since).map(toDelivery);
    },
  };
}
